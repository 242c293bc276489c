/**
 * The week report of a shop. PLACEHOLDER on main while it is built on its own branch
 * (i11-report): the route, the PDF and the Monday mail call this signature.
 */
import type { Db } from '@/db';
import type { UnitPref } from '@/ingest/wire/people';
import type { ReadingPoint } from '@/ingest/wire/readings';
import type { WeekReport } from '@/ingest/wire/reports';

export interface WeekReportInput {
  shopId: string;
  /** The Monday, shop-local, YYYY-MM-DD. */
  start: string;
  unit: UnitPref;
  now: Date;
}

/** Null when the shop does not exist. */
export async function buildWeekReport(db: Db, input: WeekReportInput): Promise<WeekReport | null> {
  throw new Error(`week report not merged yet (${String(db !== undefined)} ${input.shopId})`);
}

/** Each zone's margin series over the report's week, as the history API answers it. */
export async function weekReportSeries(
  db: Db,
  report: WeekReport,
): Promise<Map<string, ReadingPoint[]>> {
  throw new Error(
    `week report series not merged yet (${String(db !== undefined)} ${report.shop.id})`,
  );
}
