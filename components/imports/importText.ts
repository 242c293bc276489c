/** How an import's times and counts read on its cards, in the shop's time zone. */
import { formatInTimeZone } from 'date-fns-tz';

import type { Import } from '@/components/queries';
import { formatRowCount, IMPORT_WORDS, MISSING } from '@/ingest/words';

/** "2 Mar 2026 06:10 – 9 Mar 2026 18:00" on the shop's clock; a dash before any row is read. */
export function formatImportSpan(imp: Import, timeZone: string): string {
  if (imp.firstAt === null || imp.lastAt === null) return MISSING;
  const at = (iso: string) => formatInTimeZone(iso, timeZone, 'd MMM yyyy HH:mm');
  return `${at(imp.firstAt)} – ${at(imp.lastAt)}`;
}

/** When the file came in, on the shop's clock. */
export function formatImportCreated(imp: Import, timeZone: string): string {
  return formatInTimeZone(imp.createdAt, timeZone, 'd MMM yyyy HH:mm');
}

/** The figures of an import, labelled, in the order the summary and the history show them. */
export function importFigures(imp: Import): { key: string; label: string; value: string }[] {
  return [
    { key: 'stored', label: IMPORT_WORDS.rowsStored, value: formatRowCount(imp.rowsStored) },
    {
      key: 'duplicate',
      label: IMPORT_WORDS.rowsDuplicate,
      value: formatRowCount(imp.rowsDuplicate),
    },
    { key: 'rejected', label: IMPORT_WORDS.rowsRejected, value: formatRowCount(imp.rowsRejected) },
  ];
}

/**
 * The share of the file read, 0–1, from the data rows the upload counted (its lines less the
 * header); null when the count is unknown, and the bar then shows rows read without a share.
 */
export function importShare(rowsRead: number, dataRows: number | null): number | null {
  if (dataRows === null || dataRows <= 0) return null;
  return Math.min(1, Math.max(0, rowsRead / dataRows));
}
