import type { ImportMapping, ImportStatus, ImportTimeFormat } from '../wire/imports';

/**
 * Words of the CSV import (a logger's history brought in as one sensor's readings), on the
 * sensor's page. The server's refusals carry their own sentences; these are the app's labels,
 * states and notes, kept here so any message or mail about an import reads the same.
 */

/** The fields of the column choices, by the mapping key they set. */
export const IMPORT_FIELD_WORDS = {
  timeColumn: 'Time',
  airColumn: 'Air temperature',
  rhColumn: 'Relative humidity',
  surfaceColumn: 'Surface temperature (optional)',
  temperatureUnit: 'Temperature unit',
  timeFormat: 'Time format',
  timeZone: 'The logger’s time zone',
  remember: 'Remember these choices for this sensor',
} as const satisfies Record<keyof ImportMapping | 'remember', string>;

/** The surface column's "no column" choice: the surface is then estimated, as live. */
export const IMPORT_NO_SURFACE = 'None';

export const IMPORT_UNIT_WORDS: Record<ImportMapping['temperatureUnit'], string> = {
  C: '°C',
  F: '°F',
};

/**
 * Each time format with the same moment — 18:30 on 31 December 2025 — as a logger would write it;
 * the two epoch counts are that moment in UTC (1,767,205,800 s after 1970-01-01T00:00:00Z).
 */
export const IMPORT_TIME_FORMAT_WORDS: Record<
  ImportTimeFormat,
  { label: string; example: string }
> = {
  iso: { label: 'ISO 8601', example: '2025-12-31T18:30:00' },
  'day-first': { label: 'Day first', example: '31/12/2025 18:30' },
  'month-first': { label: 'Month first', example: '12/31/2025 18:30' },
  'epoch-s': { label: 'Unix seconds', example: '1767205800' },
  'epoch-ms': { label: 'Unix milliseconds', example: '1767205800000' },
};

/** Under the time zone: when it matters and when it does not. */
export const IMPORT_TIME_ZONE_HINT =
  'The zone the logger’s clock kept. Unix times and ISO times with Z or an offset ignore it.';

/** Where an import stands, in a word or two (the history list, the progress panel). */
export const IMPORT_STATUS_WORDS: Record<ImportStatus, string> = {
  uploaded: 'Not started',
  queued: 'Waiting to start',
  running: 'Importing',
  done: 'Done',
  failed: 'Failed',
  cancelled: 'Cancelled',
};

/** Statuses after which nothing changes any more. */
export const IMPORT_FINISHED: readonly ImportStatus[] = ['done', 'failed', 'cancelled'];

export const IMPORT_WORDS = {
  panelTitle: 'Import history from a logger file',
  panelHint:
    'A CSV file from a stand-alone data logger: a header row naming the columns, then one reading per line.',
  pick: 'Choose a CSV file',
  pickAnother: 'Choose another file',
  uploading: (fileName: string) => `Uploading ${fileName}…`,
  browserOnly: 'Logger files can be imported from Drybench in a browser.',
  viewerNote: 'Owners and members import logger files; you can see the imports here.',
  previewTitle: 'The first rows',
  previewHint: (shown: number, lineCount: number | null) =>
    lineCount === null
      ? `The first ${shown} rows as read.`
      : `The first ${shown} of ${Math.max(lineCount - 1, 0).toLocaleString('en-US')} rows as read.`,
  choicesTitle: 'Which column holds what',
  start: 'Start the import',
  starting: 'Starting…',
  cancel: 'Cancel the import',
  cancelQuestion:
    'Cancel this import? Nothing from it is stored; the same file can be imported again later.',
  progressTitle: (fileName: string) => `Importing ${fileName}`,
  rowsRead: 'Rows read',
  rowsStored: 'Stored',
  rowsDuplicate: 'Already there',
  rowsRejected: 'Rejected',
  span: 'Time span',
  downloadRejected: 'Download rejected rows (CSV)',
  rejectedTitle: 'Rejected rows',
  rejectedMore: (shown: number, total: number) =>
    `The first ${shown} of ${total.toLocaleString('en-US')}; the CSV lists them all.`,
  line: 'Line',
  reason: 'Reason',
  noAlarms:
    'Imported history never raises alarms or sends e-mails, since it is past. It counts in week reports and in surfaces’ exposure like any reading.',
  historyTitle: 'Past imports',
  historyEmpty: 'No logger files imported for this sensor yet.',
  anotherFile: 'Import another file',
  rememberedNote: 'Prefilled with the choices saved for this sensor.',
} as const;

/** Local checks before the choices are sent: the same rules the server applies. */
export const IMPORT_CHOICE_ERRORS = {
  required: (field: string) => `Choose the column that holds the ${field.toLowerCase()}.`,
  repeated: (column: string) => `“${column}” is chosen twice: each field needs its own column.`,
  timeZone: 'Choose the time zone the logger’s clock kept.',
} as const;

/** "1,234": counts of rows are read at a glance, so they keep their thousands separators. */
export function formatRowCount(count: number): string {
  return Math.round(count).toLocaleString('en-US');
}

/** The stored share of a file so far, as the progress bar's words: "1,200 of about 5,000 rows". */
export function importProgressText(rowsRead: number, totalRows: number | null): string {
  return totalRows === null
    ? `${formatRowCount(rowsRead)} rows read`
    : `${formatRowCount(rowsRead)} of ${formatRowCount(totalRows)} rows read`;
}

/** "2.4 MB": a file's size in decimal units, as browsers and file managers show them. */
export function formatFileSize(bytes: number): string {
  if (bytes < 1000) return `${bytes} B`;
  if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(bytes < 10_000 ? 1 : 0)} kB`;
  return `${(bytes / 1_000_000).toFixed(bytes < 10_000_000 ? 1 : 0)} MB`;
}
