/**
 * One zone of the week report on paper: its name with the worst level it reached (a coloured
 * rule and the level's word, so black-and-white prints keep the meaning), the figures table,
 * the margin chart and the verdict.
 */
import { formatInTimeZone } from 'date-fns-tz';

import type { ReadingPoint } from '@/ingest/wire/readings';
import type { WeekReport, ZoneWeekFigures } from '@/ingest/wire/reports';
import { LEVEL_WORDS, formatHours, formatMargin, formatPercent } from '@/ingest/words';

import { CHART_HEIGHT_PT, drawMarginChart } from './pdfChart';
import { FONT_BOLD, FONT_REGULAR, levelPdfColors, pdfColors, typeSizes } from './pdfLayout';
import {
  PDF_LABELS,
  ackText,
  alarmsOpenedText,
  levelHoursText,
  percentRangeText,
  temperatureRangeText,
  timeOfWetnessText,
  worstLevel,
} from './pdfWords';

/** The label column of the figures tables (the zones' and the whole shop's). */
export const LABEL_WIDTH_PT = 185;
const ROW_GAP_PT = 2;
const SECTION_GAP_PT = 16;
const MAX_SILENT_LISTED = 4;
/** The name's column leaves room for the level word at the right. */
const NAME_WIDTH = (width: number) => width - 100;

/** "Tue 3 Mar 06:10" in the shop's time zone. */
export function shopClock(atIso: string, timeZone: string): string {
  return formatInTimeZone(new Date(atIso), timeZone, 'EEE d MMM HH:mm');
}

function silentText(zone: ZoneWeekFigures, timeZone: string): string {
  if (zone.silentPeriods.length === 0) return 'none';
  const total = zone.silentPeriods.reduce((sum, p) => sum + p.hours, 0);
  const listed = zone.silentPeriods
    .slice(0, MAX_SILENT_LISTED)
    .map((p) => `${shopClock(p.from, timeZone)} – ${shopClock(p.to, timeZone)}`);
  const more = zone.silentPeriods.length - listed.length;
  return [
    `${zone.silentPeriods.length} (${formatHours(total)}):`,
    ...listed,
    ...(more > 0 ? [`and ${more} more`] : []),
  ].join('\n');
}

/** The table's rows as [label, value], every value in the reader's unit. */
export function zoneRows(zone: ZoneWeekFigures, report: WeekReport): [string, string][] {
  const { unit } = report;
  const tz = report.shop.timeZone;
  return [
    [PDF_LABELS.coverage, `${formatPercent(zone.coveragePct)} (${zone.readings} readings)`],
    [PDF_LABELS.air, temperatureRangeText(zone.airC, unit)],
    [PDF_LABELS.rh, percentRangeText(zone.rhPct)],
    [
      PDF_LABELS.lowestMargin,
      zone.lowestMargin === null
        ? 'no surface data'
        : `${formatMargin(zone.lowestMargin.marginK, unit)} at ${shopClock(zone.lowestMargin.at, tz)}`,
    ],
    [PDF_LABELS.levelHours, levelHoursText(zone.levelHours)],
    [PDF_LABELS.timeOfWetness, timeOfWetnessText(zone.timeOfWetness)],
    [PDF_LABELS.emc, percentRangeText(zone.emcPct, 1)],
    [PDF_LABELS.alarms, alarmsOpenedText(zone.alarms)],
    [PDF_LABELS.ack, ackText(zone.alarms)],
    [PDF_LABELS.silent, silentText(zone, tz)],
  ];
}

function contentWidth(doc: PDFKit.PDFDocument): number {
  return doc.page.width - doc.page.margins.left - doc.page.margins.right;
}

function headingHeight(doc: PDFKit.PDFDocument, name: string, width: number): number {
  return doc.font(FONT_BOLD).fontSize(typeSizes.heading).heightOfString(name, { width });
}

/** Height of the zone's block, to keep it on one page when it fits on one. */
export function zoneBlockHeight(
  doc: PDFKit.PDFDocument,
  zone: ZoneWeekFigures,
  report: WeekReport,
): number {
  const width = contentWidth(doc);
  doc.font(FONT_REGULAR).fontSize(typeSizes.body);
  const rows = zoneRows(zone, report).reduce(
    (sum, [label, value]) =>
      sum +
      Math.max(
        doc.heightOfString(label, { width: LABEL_WIDTH_PT - 12 }),
        doc.heightOfString(value, { width: width - LABEL_WIDTH_PT }),
      ) +
      ROW_GAP_PT,
    0,
  );
  const verdict = doc.heightOfString(zone.verdict, { width });
  return (
    headingHeight(doc, zone.name, NAME_WIDTH(width)) + 8 + rows + 6 + CHART_HEIGHT_PT + verdict + 6
  );
}

/** Draws the zone at the cursor; the caller has made room for it. */
export function drawZone(
  doc: PDFKit.PDFDocument,
  zone: ZoneWeekFigures,
  report: WeekReport,
  points: readonly ReadingPoint[],
): void {
  const left = doc.page.margins.left;
  const width = contentWidth(doc);
  const top = doc.y;
  const level = worstLevel(zone.levelHours);

  // The name first (the reading order of the text), wrapped when long; the level word at the
  // top right.
  doc.font(FONT_BOLD).fontSize(typeSizes.heading).fillColor(pdfColors.ink);
  doc.text(zone.name, left + 8, top, { width: NAME_WIDTH(width) });
  const nameBottom = doc.y;
  doc.font(FONT_BOLD).fontSize(typeSizes.body).fillColor(levelPdfColors[level]);
  doc.text(`Worst: ${LEVEL_WORDS[level]}`, left + width - 90, top + 2, {
    width: 90,
    align: 'right',
  });
  doc.y = nameBottom;
  doc.y += 4;

  for (const [label, value] of zoneRows(zone, report)) {
    const rowTop = doc.y;
    doc.font(FONT_REGULAR).fontSize(typeSizes.body).fillColor(pdfColors.iron);
    doc.text(label, left + 8, rowTop, { width: LABEL_WIDTH_PT - 12 });
    const labelBottom = doc.y;
    doc.fillColor(pdfColors.ink);
    doc.text(value, left + LABEL_WIDTH_PT, rowTop, { width: width - LABEL_WIDTH_PT });
    doc.y = Math.max(doc.y, labelBottom) + ROW_GAP_PT;
  }

  // The level rule on the left edge of the name and table, as on the app's zone cards.
  doc
    .save()
    .lineWidth(3)
    .moveTo(left + 1.5, top)
    .lineTo(left + 1.5, doc.y - ROW_GAP_PT)
    .stroke(levelPdfColors[level])
    .restore();

  doc.y += 4;
  drawMarginChart(
    doc,
    {
      points,
      fromMs: Date.parse(report.week.from),
      toMs: Date.parse(report.week.to),
      weekStart: report.week.start,
      timeZone: report.shop.timeZone,
      lowestMarginK: zone.lowestMargin?.marginK ?? null,
    },
    report.unit,
    width,
  );

  doc.font(FONT_REGULAR).fontSize(typeSizes.body).fillColor(pdfColors.ink);
  doc.text(zone.verdict, left, doc.y, { width });
  doc.y += SECTION_GAP_PT;
}
