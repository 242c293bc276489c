/**
 * A logger's CSV history brought in as one sensor's readings:
 * POST|GET /shops/:shopId/sensors/:sensorId/imports, GET …/imports/:importId,
 * POST …/imports/:importId/start and …/cancel, GET …/imports/:importId/rejected.csv, and the
 * live `{ type: "import" }` message. Types only, besides the constant lists, so the app's bundle
 * gets nothing from here but those few strings.
 */

/** Where an import stands; "uploaded" is a file whose columns are not chosen yet. */
export const IMPORT_STATUSES = [
  'uploaded',
  'queued',
  'running',
  'done',
  'failed',
  'cancelled',
] as const;
export type ImportStatus = (typeof IMPORT_STATUSES)[number];

/** How the logger wrote its times. Day or month first take `/ . -` and `HH:mm[:ss]` after a space. */
export const IMPORT_TIME_FORMATS = [
  'iso',
  'day-first',
  'month-first',
  'epoch-s',
  'epoch-ms',
] as const;
export type ImportTimeFormat = (typeof IMPORT_TIME_FORMATS)[number];

/** Which header column holds what, and how to read it; saved per sensor when asked to. */
export interface ImportMapping {
  timeColumn: string;
  airColumn: string;
  rhColumn: string;
  /** None: Drybench estimates the surface from the air, as for a live sensor without a probe. */
  surfaceColumn: string | null;
  temperatureUnit: 'C' | 'F';
  timeFormat: ImportTimeFormat;
  /** IANA; ignored for epoch times and for ISO times that carry an offset. */
  timeZone: string;
}

/** One import as every answer and the live message carry it. Times ISO 8601 UTC. */
export interface Import {
  id: string;
  sensorId: string;
  fileName: string;
  bytes: number;
  status: ImportStatus;
  rowsRead: number;
  rowsStored: number;
  /** Rows whose sensor and time were stored already: they change nothing. */
  rowsDuplicate: number;
  rowsRejected: number;
  /** The earliest and latest time read from the file; null until a row is read. */
  firstAt: string | null;
  lastAt: string | null;
  error: { code: string; message: string } | null;
  createdAt: string;
  finishedAt: string | null;
}

/** The first rows of the file as it was split, before any column is chosen. */
export interface ImportPreview {
  delimiter: string;
  columns: string[];
  /** The first 20 data rows, each cell as text. */
  rows: string[][];
  /** Lines in the file when counted cheaply; null when not. */
  lineCount: number | null;
}

/** 201 of POST …/imports. */
export interface ImportUploaded {
  import: Import;
  preview: ImportPreview;
  /** The sensor's saved choices, when the file still has their columns. */
  suggested: ImportMapping | null;
}

/** Body of POST …/imports/:importId/start. */
export interface ImportStart {
  mapping: ImportMapping;
  remember: boolean;
}

/** 202 of start, 200 of cancel, and GET …/imports/:importId. */
export interface ImportAnswer {
  import: Import;
}

/** GET …/imports: newest first, the last 20. */
export interface ImportsResponse {
  imports: Import[];
}

/** The live socket's word on an import: at most every 250 ms while running, once per status. */
export interface ImportMessage {
  type: 'import';
  shopId: string;
  import: Import;
}
