/**
 * Contrast between two sRGB colours by WCAG 2.x's definition (relative luminance, then
 * (L1 + 0.05) / (L2 + 0.05)): 4.5:1 is the floor for body text, 3:1 for large text, controls'
 * outlines and focus indicators (WCAG 2.2 SC 1.4.3, 1.4.11, 2.4.13).
 */

/** Relative luminance of a `#RRGGBB` colour (WCAG 2.x, with the sRGB threshold 0.04045). */
export function relativeLuminance(hex: string): number {
  const match = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!match) throw new Error(`Not a #RRGGBB colour: ${hex}`);
  const [r, g, b] = match.slice(1).map((part) => {
    const c = parseInt(part, 16) / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  }) as [number, number, number];
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** The contrast ratio of two colours, from 1 (same) to 21 (black on white). */
export function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x) as [
    number,
    number,
  ];
  return (hi + 0.05) / (lo + 0.05);
}
