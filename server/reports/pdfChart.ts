/**
 * A zone's dew margin over the week as a small vector chart: the lowest margin of each point of
 * the series (the same series the app's history chart reads), the zero line (surface at the dew
 * point) and a dashed line at the week's lowest margin. Below zero is shaded and named "below dew
 * point", so the chart reads in black and white; the time axis is the shop's days.
 */
import { fromZonedTime, formatInTimeZone } from 'date-fns-tz';

import { TOW_MAX_GAP_MS } from '@/ingest/wetness';
import type { ReadingPoint } from '@/ingest/wire/readings';
import type { UnitPref } from '@/ingest/wire/people';
import { formatMargin } from '@/ingest/words';

import { FONT_REGULAR, pdfColors, typeSizes } from './pdfLayout';

export interface ChartBox {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface MarginChartInput {
  points: readonly ReadingPoint[];
  /** The week as instants, ms. */
  fromMs: number;
  toMs: number;
  /** The Monday, shop-local, YYYY-MM-DD: the day lines fall on the shop's midnights. */
  weekStart: string;
  timeZone: string;
  lowestMarginK: number | null;
}

export interface MarginChartGeometry {
  loK: number;
  hiK: number;
  /** Polylines in page points; a new one starts after a gap in the series. */
  lines: [number, number][][];
  zeroY: number;
  lowestY: number | null;
  /** Each shop-local midnight inside the week, and the day it starts. */
  days: { x: number; label: string }[];
}

/** The calendar day `days` after a YYYY-MM-DD date, without touching any time zone. */
export function addCalendarDays(ymd: string, days: number): string {
  const [y, m, d] = ymd.split('-').map(Number) as [number, number, number];
  return new Date(Date.UTC(y, m - 1, d + days)).toISOString().slice(0, 10);
}

/** The margin a point contributes: the lowest inside its bucket, so a short dip stays visible. */
function pointMarginK(point: ReadingPoint): number | null {
  return point.marginMin ?? point.margin;
}

/** Pure: where everything goes inside `box` (pdfkit's y runs down the page). */
export function marginChartGeometry(input: MarginChartInput, box: ChartBox): MarginChartGeometry {
  const spanMs = Math.max(1, input.toMs - input.fromMs);
  const xOf = (ms: number) => box.x + ((ms - input.fromMs) / spanMs) * box.width;

  const known = input.points
    .map((p) => ({ atMs: Date.parse(p.at), marginK: pointMarginK(p) }))
    .filter((p): p is { atMs: number; marginK: number } => p.marginK !== null)
    .filter((p) => p.atMs >= input.fromMs && p.atMs < input.toMs)
    .sort((a, b) => a.atMs - b.atMs);

  const values = known.map((p) => p.marginK);
  if (input.lowestMarginK !== null) values.push(input.lowestMarginK);
  // Zero is always on the chart: it is the line the whole report is about.
  let loK = Math.min(0, ...values);
  let hiK = Math.max(0, ...values);
  // At least 2 K of height, so a flat week does not blow noise up to the full chart.
  if (hiK - loK < 2) hiK = loK + 2;
  const padK = (hiK - loK) * 0.08;
  loK -= padK;
  hiK += padK;
  const yOf = (k: number) => box.y + ((hiK - k) / (hiK - loK)) * box.height;

  // A line breaks where the series has a hole: longer than the report's gap cap, or than twice
  // the series' usual step when it is bucketed coarser than that.
  const steps = known
    .slice(1)
    .map((p, i) => p.atMs - known[i]!.atMs)
    .sort((a, b) => a - b);
  const medianStepMs = steps.length > 0 ? steps[Math.floor(steps.length / 2)]! : 0;
  const gapMs = Math.max(TOW_MAX_GAP_MS, 2 * medianStepMs);

  // More points than half-points across: keep the lowest per column, as the buckets do.
  const columns = Math.max(1, Math.floor(box.width * 2));
  const thinned: { atMs: number; marginK: number }[] = [];
  let lastColumn = -1;
  for (const p of known) {
    const column = Math.floor(((p.atMs - input.fromMs) / spanMs) * columns);
    const previous = thinned[thinned.length - 1];
    const gap = previous !== undefined && p.atMs - previous.atMs > gapMs;
    if (known.length > columns && column === lastColumn && previous && !gap) {
      if (p.marginK < previous.marginK) previous.marginK = p.marginK;
      continue;
    }
    thinned.push({ ...p });
    lastColumn = column;
  }

  const lines: [number, number][][] = [];
  let line: [number, number][] = [];
  let previousMs: number | null = null;
  for (const p of thinned) {
    if (previousMs !== null && p.atMs - previousMs > gapMs && line.length > 0) {
      lines.push(line);
      line = [];
    }
    line.push([xOf(p.atMs), yOf(p.marginK)]);
    previousMs = p.atMs;
  }
  if (line.length > 0) lines.push(line);

  const days: { x: number; label: string }[] = [];
  for (let i = 0; i < 7; i += 1) {
    const ymd = addCalendarDays(input.weekStart, i);
    const midnight = fromZonedTime(`${ymd}T00:00:00`, input.timeZone);
    days.push({
      x: xOf(midnight.getTime()),
      label: formatInTimeZone(midnight, input.timeZone, 'EEE d'),
    });
  }

  return {
    loK,
    hiK,
    lines,
    zeroY: yOf(0),
    lowestY: input.lowestMarginK === null ? null : yOf(input.lowestMarginK),
    days,
  };
}

/** Height the chart takes with its axis labels and legend under it. */
export const CHART_HEIGHT_PT = 86;
const PLOT_HEIGHT_PT = 58;
const GUTTER_PT = 44;

/** Draws the chart at the document's cursor across `width`, and moves the cursor under it. */
export function drawMarginChart(
  doc: PDFKit.PDFDocument,
  input: MarginChartInput,
  unit: UnitPref,
  width: number,
): void {
  const left = doc.page.margins.left;
  const top = doc.y;
  const box: ChartBox = {
    x: left + GUTTER_PT,
    y: top + 4,
    width: width - GUTTER_PT,
    height: PLOT_HEIGHT_PT,
  };
  const geometry = marginChartGeometry(input, box);
  const small = typeSizes.small;
  doc.save();

  // Below the dew point, shaded in the wet colour and named in words.
  const bottom = box.y + box.height;
  if (geometry.zeroY < bottom) {
    doc
      .rect(box.x, geometry.zeroY, box.width, bottom - geometry.zeroY)
      .fillOpacity(0.1)
      .fill(pdfColors.wet)
      .fillOpacity(1);
  }
  doc.lineWidth(0.5).rect(box.x, box.y, box.width, box.height).stroke(pdfColors.border);

  for (const day of geometry.days) {
    doc.moveTo(day.x, box.y).lineTo(day.x, bottom).lineWidth(0.4).stroke(pdfColors.border);
    doc
      .font(FONT_REGULAR)
      .fontSize(small)
      .fillColor(pdfColors.iron)
      .text(day.label, day.x + 2, bottom + 2, { lineBreak: false });
  }

  doc.moveTo(box.x, geometry.zeroY).lineTo(box.x + box.width, geometry.zeroY);
  doc.lineWidth(1).stroke(pdfColors.dew);

  if (geometry.lowestY !== null) {
    doc.moveTo(box.x, geometry.lowestY).lineTo(box.x + box.width, geometry.lowestY);
    doc.lineWidth(0.6).dash(3, { space: 2 }).stroke(pdfColors.ink).undash();
  }

  for (const line of geometry.lines) {
    const [first, ...rest] = line;
    if (!first) continue;
    if (rest.length === 0) {
      doc.circle(first[0], first[1], 0.9).fill(pdfColors.ink);
      continue;
    }
    doc.moveTo(first[0], first[1]);
    for (const [x, y] of rest) doc.lineTo(x, y);
    doc.lineWidth(0.8).lineJoin('round').stroke(pdfColors.ink);
  }

  // Y labels: the top and bottom of the scale and the dew point, in the reader's unit.
  const yLabel = (text: string, y: number) =>
    doc
      .font(FONT_REGULAR)
      .fontSize(small)
      .fillColor(pdfColors.iron)
      .text(text, left, y - small / 2, { width: GUTTER_PT - 4, align: 'right', lineBreak: false });
  // An empty chart gets no scale: numbers there would describe nothing.
  if (geometry.lines.length > 0) {
    yLabel(formatMargin(geometry.hiK, unit), box.y + small / 2);
    yLabel(formatMargin(geometry.loK, unit), bottom - small / 2);
  }
  if (geometry.zeroY - box.y > small * 1.5 && bottom - geometry.zeroY > small * 1.5) {
    yLabel(formatMargin(0, unit), geometry.zeroY);
  }

  if (geometry.lines.length === 0) {
    doc
      .font(FONT_REGULAR)
      .fontSize(typeSizes.body)
      .fillColor(pdfColors.iron)
      .text('No readings this week', box.x, box.y + box.height / 2 - typeSizes.body / 2, {
        width: box.width,
        align: 'center',
        lineBreak: false,
      });
  }

  const lowest =
    input.lowestMarginK === null ? '' : `   - - lowest ${formatMargin(input.lowestMarginK, unit)}`;
  doc
    .font(FONT_REGULAR)
    .fontSize(small)
    .fillColor(pdfColors.iron)
    .text(
      `Dew margin: ── lowest in each step   ━ 0 = dew point   ░ below dew point${lowest}`,
      left,
      bottom + small + 6,
      { width, lineBreak: false },
    );
  doc.restore();
  doc.x = left;
  doc.y = top + CHART_HEIGHT_PT;
}
