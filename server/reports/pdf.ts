/**
 * The week report as a PDF. PLACEHOLDER on main while the renderer is built on its own branch
 * (i11-pdf): the route and the Monday mail call this signature.
 */
import type { ReadingPoint } from '@/ingest/wire/readings';
import type { WeekReport } from '@/ingest/wire/reports';

export interface WeekReportPdfInput {
  report: WeekReport;
  /** Each zone's margin series over the week, as GET …/zones/:zoneId/readings answers it. */
  series: Map<string, ReadingPoint[]>;
}

export async function renderWeekReportPdf(input: WeekReportPdfInput): Promise<Buffer> {
  throw new Error(`PDF renderer not merged yet (${input.report.shop.id})`);
}
