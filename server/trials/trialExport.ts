/**
 * What a trial's CSV and PDF are made from: the same Trial object the JSON answer is (standings
 * and conditions included, so the three never disagree), plus what a file needs beyond it — the
 * shop's name, time zone and paper, the reader's unit and the names of the tests' zones.
 */
import { formatInTimeZone } from 'date-fns-tz';

import type { PaperSize } from '@/ingest/wire/reports';
import type { Trial } from '@/ingest/wire/trials';
import type { TemperatureUnit } from '@/ingest/units';
import { trialFileName } from '@/ingest/words/trials';

export const TRIAL_EXPORT_FORMATS = ['json', 'csv', 'pdf'] as const;

export interface TrialExport {
  trial: Trial;
  shop: { name: string; timeZone: string; paperSize: PaperSize };
  unit: TemperatureUnit;
  /** Zone id → name, for the tests that have a zone. */
  zoneNames: ReadonlyMap<string, string>;
  /** When the file was made, ISO 8601. */
  generatedAt: string;
}

/** "2026-03-02T18:00-06:00": a test's time on the shop's clock with its offset. */
export function shopTimeWithOffset(at: string, timeZone: string): string {
  return formatInTimeZone(new Date(at), timeZone, "yyyy-MM-dd'T'HH:mmxxx");
}

/** "2026-03-09 07:00 +01:00 (Europe/Berlin)", as the PDF's footer says when it was made. */
export function madeText(e: TrialExport): string {
  return `${formatInTimeZone(new Date(e.generatedAt), e.shop.timeZone, 'yyyy-MM-dd HH:mm xxx')} (${e.shop.timeZone})`;
}

/** `trial-<slug>-<date>.csv`, dated on the shop's calendar. */
export function trialExportFileName(e: TrialExport, format: 'csv' | 'pdf'): string {
  const date = formatInTimeZone(new Date(e.generatedAt), e.shop.timeZone, 'yyyy-MM-dd');
  return trialFileName(e.trial.name, date, format);
}
