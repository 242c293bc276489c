/**
 * A pdfkit document on the shop's sheet with JetBrains Mono embedded, and the footer every page
 * carries ("made …" and "page i of n"): shared by the week report and the trial export, so both
 * print alike.
 */
import type PDFKitDocument from 'pdfkit';

import type { PaperSize } from '@/ingest/wire/reports';

import {
  FONT_BOLD,
  FONT_FILES,
  FONT_REGULAR,
  FOOTER_PT,
  MARGIN_PT,
  PAPER_POINTS,
  pdfColors,
  typeSizes,
} from './pdfLayout';

export interface StartedPdf {
  doc: PDFKit.PDFDocument;
  /** The width between the side margins, pt. */
  width: number;
  /** The whole file, once `doc.end()` has been called. */
  done: Promise<Buffer>;
}

/**
 * pdfkit (with its font engine) is loaded on the first PDF, not at start: it is ~6 MB of heap
 * a server holds for good once loaded, and most instances make a PDF once a week (README,
 * issue 13's memory row).
 */
let pdfkit: Promise<typeof PDFKitDocument> | undefined;
const loadPdfkit = () => (pdfkit ??= import('pdfkit').then((m) => m.default));

export async function startPdf(
  paperSize: PaperSize,
  info: PDFKit.DocumentInfo,
): Promise<StartedPdf> {
  const PDFDocument = await loadPdfkit();
  const paper = PAPER_POINTS[paperSize];
  const doc = new PDFDocument({
    size: [paper.width, paper.height],
    margins: {
      top: MARGIN_PT,
      left: MARGIN_PT,
      right: MARGIN_PT,
      bottom: MARGIN_PT + FOOTER_PT,
    },
    // Footers are written once every page exists, to know n in "page i of n".
    bufferPages: true,
    // Start on our face: the default Helvetica would otherwise be set up and referenced.
    font: FONT_FILES[FONT_REGULAR],
    lang: 'en',
    displayTitle: true,
    info: { Author: 'Drybench', Creator: 'Drybench', ...info },
  });
  doc.registerFont(FONT_REGULAR, FONT_FILES[FONT_REGULAR]);
  doc.registerFont(FONT_BOLD, FONT_FILES[FONT_BOLD]);

  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  return { doc, width: paper.width - 2 * MARGIN_PT, done };
}

/** Writes `made` and "page i of n" on every page, once all pages exist. */
export function drawFooters(doc: PDFKit.PDFDocument, made: string, width: number): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i += 1) {
    doc.switchToPage(i);
    // Writing inside the bottom margin would make pdfkit start a new page.
    const bottomMargin = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const y = doc.page.height - MARGIN_PT - typeSizes.small;
    const left = doc.page.margins.left;
    doc.font(FONT_REGULAR).fontSize(typeSizes.small).fillColor(pdfColors.iron);
    doc.text(made, left, y, { width: width - 90, lineBreak: false });
    doc.text(`page ${i - range.start + 1} of ${range.count}`, left + width - 90, y, {
      width: 90,
      align: 'right',
      lineBreak: false,
    });
    doc.page.margins.bottom = bottomMargin;
  }
}
