import { focusRing } from '@/components/theme';

/**
 * The page-wide rule that draws the focus ring on every control a keyboard reaches
 * (`:focus-visible`, so a mouse click draws none). The inner band is a box-shadow at the
 * control's edge and the outer one an outline past it, so the ring keeps both tones on any
 * shape. `!important` because react-native-web gives inputs `outline: none` by its own classes.
 */
export function focusRingCss(): string {
  const band = focusRing.bandPx;
  return [
    ':focus-visible {',
    `  outline: ${band}px solid ${focusRing.outer} !important;`,
    `  outline-offset: ${band}px !important;`,
    `  box-shadow: 0 0 0 ${band}px ${focusRing.inner} !important;`,
    '}',
  ].join('\n');
}
