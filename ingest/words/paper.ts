/** The report's sheet as people name it (the shop settings, the PDF's own description). */
import type { PaperSize } from '../wire/reports';

export const PAPER_SIZE_WORDS: Record<PaperSize, string> = {
  a4: 'A4',
  letter: 'US Letter',
};

/** The sheet's size, for the line under the choice. */
export const PAPER_SIZE_DETAILS: Record<PaperSize, string> = {
  a4: '210 × 297 mm',
  letter: '8.5 × 11 in',
};
