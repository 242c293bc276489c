/**
 * CSV imports: the import rows, their rejected lines and a sensor's remembered column choices.
 * Status changes are compare-and-set on the status, so a cancel and the job's own steps never
 * overwrite each other: whichever commits first wins and the other changes nothing.
 */
import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import type pg from 'pg';

import type { ImportMapping, ImportStatus } from '@/ingest/wire/imports';

import type { Db } from '../index';
import { imports, sensorImportMappings, sensors, zones } from '../schema';
import { identityColumns, type SensorIdentity } from './sensors';

export type ImportRow = typeof imports.$inferSelect;

export async function insertImport(
  db: Db,
  row: Pick<
    ImportRow,
    | 'id'
    | 'shopId'
    | 'sensorId'
    | 'fileName'
    | 'bytes'
    | 'objectKey'
    | 'delimiter'
    | 'columns'
    | 'sampleRows'
    | 'createdBy'
  >,
): Promise<ImportRow> {
  const [inserted] = await db.insert(imports).values(row).returning();
  if (!inserted) throw new Error('import insert returned no row');
  return inserted;
}

const ofSensor = (shopId: string, sensorId: string, importId: string) =>
  and(eq(imports.shopId, shopId), eq(imports.sensorId, sensorId), eq(imports.id, importId));

export async function findImport(
  db: Db,
  shopId: string,
  sensorId: string,
  importId: string,
): Promise<ImportRow | null> {
  const [row] = await db
    .select()
    .from(imports)
    .where(ofSensor(shopId, sensorId, importId));
  return row ?? null;
}

export async function findImportById(db: Db, importId: string): Promise<ImportRow | null> {
  const [row] = await db.select().from(imports).where(eq(imports.id, importId));
  return row ?? null;
}

/** A sensor's imports, newest first. */
export async function listImports(
  db: Db,
  shopId: string,
  sensorId: string,
  limit = 20,
): Promise<ImportRow[]> {
  return db
    .select()
    .from(imports)
    .where(and(eq(imports.shopId, shopId), eq(imports.sensorId, sensorId)))
    .orderBy(desc(imports.createdAt), desc(imports.id))
    .limit(limit);
}

/** uploaded → queued with its mapping; null when it was not waiting to be started. */
export async function queueImport(
  db: Db,
  importId: string,
  mapping: ImportMapping,
): Promise<ImportRow | null> {
  const [row] = await db
    .update(imports)
    .set({ status: 'queued', mapping })
    .where(and(eq(imports.id, importId), eq(imports.status, 'uploaded')))
    .returning();
  return row ?? null;
}

/** Marks an import cancelled unless it has ended; null when it had (done, failed, cancelled). */
export async function cancelImport(db: Db, importId: string): Promise<ImportRow | null> {
  const [row] = await db
    .update(imports)
    .set({ status: 'cancelled', cancelRequestedAt: sql`now()`, finishedAt: sql`now()` })
    .where(
      and(eq(imports.id, importId), inArray(imports.status, ['uploaded', 'queued', 'running'])),
    )
    .returning();
  return row ?? null;
}

/** queued → running, for the job; null when it is no longer queued (cancelled meanwhile). */
export async function claimImport(db: Db, importId: string): Promise<ImportRow | null> {
  const [row] = await db
    .update(imports)
    .set({ status: 'running' })
    .where(and(eq(imports.id, importId), eq(imports.status, 'queued')))
    .returning();
  return row ?? null;
}

export interface ImportCounts {
  rowsRead: number;
  rowsStored: number;
  rowsDuplicate: number;
  rowsRejected: number;
  firstAt: Date | null;
  lastAt: Date | null;
}

/** The counts as the parameters $2…$7 of the statements below. */
const countValues = (c: ImportCounts) => [
  c.rowsRead,
  c.rowsStored,
  c.rowsDuplicate,
  c.rowsRejected,
  c.firstAt,
  c.lastAt,
];

/**
 * The running import's counts, and its live message (built by the caller from the row it
 * would become) in the same statement. Null when it is no longer running: a cancel came.
 */
export async function recordProgress(
  pool: pg.Pool,
  importId: string,
  counts: ImportCounts,
  liveMessage: (row: ImportRow) => string,
  channel: string,
): Promise<ImportRow | null> {
  const current = await pool.query<{ status: ImportStatus }>(
    `update imports set rows_read = $2, rows_stored = $3, rows_duplicate = $4, rows_rejected = $5,
       first_at = $6, last_at = $7
     where id = $1 and status = 'running' returning status`,
    [importId, ...countValues(counts)],
  );
  if (current.rowCount === 0) return null;
  return notifyRow(pool, importId, liveMessage, channel);
}

/** Reads the import and sends its live message; the row as sent. */
async function notifyRow(
  executor: Pick<pg.Pool, 'query'>,
  importId: string,
  liveMessage: (row: ImportRow) => string,
  channel: string,
): Promise<ImportRow | null> {
  const row = await readRow(executor, importId);
  if (row) await executor.query('select pg_notify($1, $2)', [channel, liveMessage(row)]);
  return row;
}

/** The import as Drizzle would return it, through a plain pg client (the job's transaction). */
export async function readRow(
  executor: Pick<pg.Pool, 'query'>,
  importId: string,
): Promise<ImportRow | null> {
  const { rows } = await executor.query(
    `select id, shop_id, sensor_id, file_name, bytes, object_key, delimiter, columns, sample_rows, mapping,
       status, rows_read, rows_stored, rows_duplicate, rows_rejected, first_at, last_at,
       error_code, error_message, cancel_requested_at, created_by, created_at, finished_at
     from imports where id = $1`,
    [importId],
  );
  const r = rows[0] as Record<string, unknown> | undefined;
  if (!r) return null;
  return {
    id: r.id as string,
    shopId: r.shop_id as string,
    sensorId: r.sensor_id as string,
    fileName: r.file_name as string,
    bytes: r.bytes as number,
    objectKey: r.object_key as string,
    delimiter: r.delimiter as string,
    columns: r.columns as string[],
    sampleRows: r.sample_rows as string[][],
    mapping: (r.mapping as ImportMapping | null) ?? null,
    status: r.status as ImportStatus,
    rowsRead: r.rows_read as number,
    rowsStored: r.rows_stored as number,
    rowsDuplicate: r.rows_duplicate as number,
    rowsRejected: r.rows_rejected as number,
    firstAt: r.first_at as Date | null,
    lastAt: r.last_at as Date | null,
    errorCode: r.error_code as string | null,
    errorMessage: r.error_message as string | null,
    cancelRequestedAt: r.cancel_requested_at as Date | null,
    createdBy: r.created_by as string | null,
    createdAt: r.created_at as Date,
    finishedAt: r.finished_at as Date | null,
  };
}

/**
 * The last step of the job's transaction: running → done with the final counts, and the live
 * message, which PostgreSQL sends only if the transaction commits. False when the import is no
 * longer running (cancelled): the caller rolls everything back.
 */
export async function finishImport(
  client: pg.ClientBase,
  importId: string,
  counts: ImportCounts,
  liveMessage: (row: ImportRow) => string,
  channel: string,
): Promise<boolean> {
  const updated = await client.query(
    `update imports set status = 'done', rows_read = $2, rows_stored = $3, rows_duplicate = $4,
       rows_rejected = $5, first_at = $6, last_at = $7, finished_at = now()
     where id = $1 and status = 'running'`,
    [importId, ...countValues(counts)],
  );
  if (updated.rowCount === 0) return false;
  await notifyRow(client, importId, liveMessage, channel);
  return true;
}

/** running/queued → failed with the reason (nothing was stored); its live message. */
export async function failImport(
  pool: pg.Pool,
  importId: string,
  error: { code: string; message: string },
  liveMessage: (row: ImportRow) => string,
  channel: string,
): Promise<void> {
  const updated = await pool.query(
    `update imports set status = 'failed', error_code = $2, error_message = $3,
       rows_stored = 0, rows_duplicate = 0, finished_at = now()
     where id = $1 and status in ('queued', 'running')`,
    [importId, error.code, error.message],
  );
  if (updated.rowCount) await notifyRow(pool, importId, liveMessage, channel);
}

/**
 * Uploads never started and older than `before`: cancelled with the reason, in one
 * compare-and-set (a start that commits first wins and the row is left alone). The object keys
 * of the files to let go of.
 */
export async function expireUploads(
  pool: pg.Pool,
  before: Date,
  error: { code: string; message: string },
): Promise<{ id: string; objectKey: string }[]> {
  const { rows } = await pool.query<{ id: string; object_key: string }>(
    `update imports set status = 'cancelled', error_code = $2, error_message = $3,
       finished_at = now()
     where status = 'uploaded' and created_at < $1
     returning id, object_key`,
    [before, error.code, error.message],
  );
  return rows.map((r) => ({ id: r.id, objectKey: r.object_key }));
}

/** The lines of the file that were not stored, in line order, inserted in the job's transaction. */
export async function insertRejects(
  client: pg.ClientBase,
  importId: string,
  rejects: readonly { line: number; reason: string; row: string }[],
): Promise<void> {
  for (let i = 0; i < rejects.length; i += 5000) {
    const part = rejects.slice(i, i + 5000);
    await client.query(
      `insert into import_rejects (import_id, line, reason, row)
       select $1, * from unnest($2::int[], $3::text[], $4::text[])`,
      [importId, part.map((r) => r.line), part.map((r) => r.reason), part.map((r) => r.row)],
    );
  }
}

export async function listRejects(
  db: Db,
  importId: string,
): Promise<{ line: number; reason: string; row: string }[]> {
  const { rows } = await db.execute<{ line: number; reason: string; row: string }>(sql`
    select line, reason, row from import_rejects where import_id = ${importId} order by line`);
  return rows;
}

export async function saveSensorMapping(
  db: Db,
  sensorId: string,
  mapping: ImportMapping,
): Promise<void> {
  await db
    .insert(sensorImportMappings)
    .values({ sensorId, mapping })
    .onConflictDoUpdate({
      target: sensorImportMappings.sensorId,
      set: { mapping, updatedAt: sql`now()` },
    });
}

export async function findSensorMapping(db: Db, sensorId: string): Promise<ImportMapping | null> {
  const [row] = await db
    .select({ mapping: sensorImportMappings.mapping })
    .from(sensorImportMappings)
    .where(eq(sensorImportMappings.sensorId, sensorId));
  return row?.mapping ?? null;
}

/** The sensor and its zone's limits as the import derives with them (removed sensors too). */
export async function importSensorIdentity(
  db: Db,
  shopId: string,
  sensorId: string,
): Promise<SensorIdentity | null> {
  const [row] = await db
    .select(identityColumns)
    .from(sensors)
    .innerJoin(zones, eq(zones.id, sensors.zoneId))
    .where(and(eq(sensors.shopId, shopId), eq(sensors.id, sensorId)));
  return row ?? null;
}
