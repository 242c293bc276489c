/**
 * A face as a CSS font-family with a monospace fallback. The page declares the faces with
 * font-display: swap (scripts/webpage/finishExport.ts), so until a face has arrived the browser
 * shows the fallback instead of nothing; a monospace one keeps the shape of every line (the
 * faces advance 0.6 em a character, as common monospace fallbacks do, and every text style sets
 * its line height), so nothing moves when the face swaps in.
 */
export function fontFamily(face: string): string {
  return `${face}, monospace`;
}
