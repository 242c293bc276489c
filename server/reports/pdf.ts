/**
 * The week report as a PDF (pdfkit), made from the same WeekReport object the JSON and the CSV
 * are: the title with the shop and its week, the whole-shop line, then per zone a figures table,
 * a small margin chart drawn as vector lines from the zone's series and the verdict. JetBrains
 * Mono is embedded (subset); the sheet is the shop's paper size; every page says "page i of n"
 * and when the report was made, in the shop's time zone.
 */
import { formatInTimeZone } from 'date-fns-tz';

import type { ReadingPoint } from '@/ingest/wire/readings';
import type { WeekReport } from '@/ingest/wire/reports';
import { formatHours, formatMargin, formatPercent, reportTitle } from '@/ingest/words';

import { drawFooters, startPdf } from './pdfDocument';
import { FONT_BOLD, FONT_REGULAR, pdfColors, typeSizes } from './pdfLayout';
import { ackOrMissing } from './pdfWords';
import { LABEL_WIDTH_PT, drawZone, shopClock, zoneBlockHeight } from './pdfZone';

export interface WeekReportPdfInput {
  report: WeekReport;
  /** Each zone's margin series over the week, as GET …/zones/:zoneId/readings answers it. */
  series: Map<string, ReadingPoint[]>;
}

/** "2026-03-09 07:00 +01:00 (Europe/Berlin)". */
export function generatedText(report: WeekReport): string {
  const at = new Date(report.generatedAt);
  return `${formatInTimeZone(at, report.shop.timeZone, 'yyyy-MM-dd HH:mm xxx')} (${report.shop.timeZone})`;
}

function unitLine(report: WeekReport): string {
  return report.unit === 'F'
    ? 'Temperatures in °F. Dew margins are differences: 1 K of margin is 1.8 °F.'
    : 'Temperatures in °C. Dew margins are differences: 1 K of margin is 1 °C.';
}

/** The whole-shop rows, in the reader's unit. */
export function shopRows(report: WeekReport): [string, string][] {
  const s = report.shopWide;
  const tz = report.shop.timeZone;
  return [
    ['Zones / data coverage', `${s.zones} / ${formatPercent(s.coveragePct)}`],
    [
      'Lowest dew margin',
      s.lowestMargin === null
        ? 'no surface data'
        : `${formatMargin(s.lowestMargin.marginK, report.unit)} in ${s.lowestMargin.zoneName} at ${shopClock(s.lowestMargin.at, tz)}`,
    ],
    [
      'Hours wet / close, all zones',
      `${formatHours(s.wetHours)} / ${formatHours(s.closeHours)}; ${s.zonesWet} zone${s.zonesWet === 1 ? '' : 's'} wet`,
    ],
    [
      'Alarms opened',
      `${s.alarmsOpened}; median to acknowledge ${ackOrMissing(s.medianAckMinutes)}; ${s.unacknowledged} not acknowledged`,
    ],
  ];
}

function drawHeader(doc: PDFKit.PDFDocument, report: WeekReport, width: number): void {
  const left = doc.page.margins.left;
  doc.font(FONT_BOLD).fontSize(typeSizes.title).fillColor(pdfColors.ink);
  doc.text(`Week report · ${report.shop.name}`, left, doc.y, { width });
  doc.moveDown(0.2);
  doc.font(FONT_REGULAR).fontSize(typeSizes.body + 1);
  doc.text(`${reportTitle(report)}, ${report.shop.timeZone} time`, { width });
  doc.fontSize(typeSizes.body).fillColor(pdfColors.iron);
  if (report.week.note) doc.text(report.week.note, { width });
  if (Date.parse(report.week.periodEnd) < Date.parse(report.week.to)) {
    doc.text(
      `Figures up to ${shopClock(report.week.periodEnd, report.shop.timeZone)}: the week is not over.`,
      { width },
    );
  }
  doc.text(unitLine(report), { width });
  doc.moveDown(0.8);
}

function drawShopWide(doc: PDFKit.PDFDocument, report: WeekReport, width: number): void {
  const left = doc.page.margins.left;
  const top = doc.y;
  doc.font(FONT_BOLD).fontSize(typeSizes.heading).fillColor(pdfColors.ink);
  doc.text('Whole shop', left + 8, top, { width: width - 16 });
  doc.moveDown(0.2);
  for (const [label, value] of shopRows(report)) {
    const rowTop = doc.y;
    doc.font(FONT_REGULAR).fontSize(typeSizes.body).fillColor(pdfColors.iron);
    doc.text(label, left + 8, rowTop, { width: LABEL_WIDTH_PT - 12 });
    const labelBottom = doc.y;
    doc.fillColor(pdfColors.ink).text(value, left + LABEL_WIDTH_PT, rowTop, {
      width: width - LABEL_WIDTH_PT - 8,
    });
    doc.y = Math.max(doc.y, labelBottom) + 2;
  }
  doc.text(report.shopWide.verdict, left + 8, doc.y + 2, { width: width - 16 });
  const bottom = doc.y + 6;
  doc
    .save()
    .lineWidth(0.8)
    .roundedRect(left, top - 6, width, bottom - top + 6, 6)
    .stroke(pdfColors.iron)
    .restore();
  doc.x = left;
  doc.y = bottom + 14;
}

export async function renderWeekReportPdf(input: WeekReportPdfInput): Promise<Buffer> {
  const { report, series } = input;
  const { doc, width, done } = await startPdf(report.shop.paperSize, {
    Title: `Week report ${report.shop.name} ${report.week.start}`,
    Subject: `Week of ${report.week.start}, ${report.shop.timeZone}`,
    CreationDate: new Date(report.generatedAt),
  });
  drawHeader(doc, report, width);
  drawShopWide(doc, report, width);

  const pageBottom = () => doc.page.height - doc.page.margins.bottom;
  for (const zone of report.zones) {
    const height = zoneBlockHeight(doc, zone, report);
    const atPageTop = doc.y <= doc.page.margins.top + 1;
    if (doc.y + height > pageBottom() && !atPageTop) doc.addPage();
    drawZone(doc, zone, report, series.get(zone.zoneId) ?? []);
  }

  drawFooters(doc, `Drybench · made ${generatedText(report)}`, width);
  doc.end();
  return done;
}
