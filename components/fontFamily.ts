/** A face registered by useFonts, as a style's fontFamily: on native the name alone. */
export function fontFamily(face: string): string {
  return face;
}
