/**
 * The week report as CSV: a header naming each column with its unit (ingest/words/report.ts
 * REPORT_COLUMNS), a first line for the whole shop (its first cell says so) and one line per
 * zone, values in the reader's unit. UTF-8 with CRLF line ends, as spreadsheets expect.
 */
import Papa from 'papaparse';

import type { WeekReport } from '@/ingest/wire/reports';
import { REPORT_COLUMNS, SHOP_WIDE_LABEL, type ReportCell } from '@/ingest/words/report';

/**
 * A spreadsheet runs a cell that begins with = + - @ (or a tab or carriage return) as a formula;
 * a zone named "=HYPERLINK(…)" must stay text. OWASP's CSV injection advice: prefix a single
 * quote. Only text cells: a negative number is a number, not a formula.
 */
export function neutraliseCell(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

/** Numbers with at most 3 decimals (hours to 3.6 s, temperatures to a thousandth of a degree). */
function cellText(value: ReportCell, kind: 'text' | 'number' | 'time'): string {
  if (value === null) return '';
  if (typeof value === 'number') return String(Number(value.toFixed(3)));
  return kind === 'text' ? neutraliseCell(value) : value;
}

export function weekReportCsv(report: WeekReport): string {
  const { unit } = report;
  const tz = report.shop.timeZone;
  const header = REPORT_COLUMNS.map((c) => c.label(unit));
  const shopLine = REPORT_COLUMNS.map((c, i) =>
    i === 0 ? SHOP_WIDE_LABEL : cellText(c.shop?.(report.shopWide, unit, tz) ?? null, c.kind),
  );
  const zoneLines = report.zones.map((z) =>
    REPORT_COLUMNS.map((c) => cellText(c.zone(z, unit, tz), c.kind)),
  );
  return `${Papa.unparse([header, shopLine, ...zoneLines], { newline: '\r\n' })}\r\n`;
}
