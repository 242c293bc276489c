/**
 * CSV imports: a logger file brought in as one sensor's readings. The file itself lives in
 * object storage (server/storage/) under `object_key` until the import ends; the lines that could
 * not be stored are kept here with their reasons, for rejected.csv.
 */
import {
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core';

import { IMPORT_STATUSES, type ImportMapping } from '@/ingest/wire/imports';

import { createdAt } from './columns';
import { shops, users } from './people';
import { sensors } from './sensing';

export const importStatusEnum = pgEnum('import_status', IMPORT_STATUSES);

export const imports = pgTable(
  'imports',
  {
    id: uuid().primaryKey(),
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    sensorId: uuid()
      .notNull()
      .references(() => sensors.id, { onDelete: 'cascade' }),
    fileName: text().notNull(),
    bytes: integer().notNull(),
    objectKey: text().notNull(),
    /** What the preview found: the delimiter and the header's column names. */
    delimiter: text().notNull(),
    columns: jsonb().$type<string[]>().notNull(),
    /** The first 20 data rows as split: the preview, and the sample the start checks read. */
    sampleRows: jsonb().$type<string[][]>().notNull(),
    mapping: jsonb().$type<ImportMapping>(),
    status: importStatusEnum().notNull().default('uploaded'),
    rowsRead: integer().notNull().default(0),
    rowsStored: integer().notNull().default(0),
    rowsDuplicate: integer().notNull().default(0),
    rowsRejected: integer().notNull().default(0),
    firstAt: timestamp({ withTimezone: true }),
    lastAt: timestamp({ withTimezone: true }),
    errorCode: text(),
    errorMessage: text(),
    /** Set by a cancel while queued or running; the job sees it between chunks and rolls back. */
    cancelRequestedAt: timestamp({ withTimezone: true }),
    // The person may leave; the import stays with the sensor's history.
    createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    finishedAt: timestamp({ withTimezone: true }),
  },
  (t) => [index('imports_sensor_created_idx').on(t.sensorId, t.createdAt)],
);

/** One line of the file that was not stored, with its line number (1 = the header). */
export const importRejects = pgTable(
  'import_rejects',
  {
    importId: uuid()
      .notNull()
      .references(() => imports.id, { onDelete: 'cascade' }),
    line: integer().notNull(),
    reason: text().notNull(),
    /** The line as the file had it, cut at 500 characters. */
    row: text().notNull(),
  },
  (t) => [primaryKey({ columns: [t.importId, t.line] })],
);

/** A sensor's remembered column choices, offered again for its next file. */
export const sensorImportMappings = pgTable('sensor_import_mappings', {
  sensorId: uuid()
    .primaryKey()
    .references(() => sensors.id, { onDelete: 'cascade' }),
  mapping: jsonb().$type<ImportMapping>().notNull(),
  updatedAt: createdAt(),
});
