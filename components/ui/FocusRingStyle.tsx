/** Native platforms draw their own focus; the web twin (FocusRingStyle.web.tsx) adds the ring. */
export function FocusRingStyle() {
  return null;
}
