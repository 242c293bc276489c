/**
 * The import job: one uploaded file becomes one sensor's readings, whole or not at all.
 *
 * In ONE transaction, on a connection of its own:
 * 1. Stream the object from storage through papaparse (already a dependency; SETUP-NOTES
 *    measured it faster than csv-parse on this machine — not re-measured here), reading each
 *    line through the chosen columns (ingest/importRows.ts) and the live checks
 *    (ingest/derive.ts `deriveAir`), deriving each accepted reading exactly as a live batch is
 *    derived (server/readings/prepare.ts: the surface estimate over the readings in time order,
 *    rebuilt from the stored readings before them, then the margin and level with the zone's
 *    limits) and COPYing it into a temporary staging table as it goes (./stage.ts): memory
 *    holds a few chunks of rows, not the file. Rejected lines are kept with their line numbers
 *    and reasons.
 * 2. A file out of time order is derived again from the staging table in time order.
 * 3. One `insert into readings select … on conflict do nothing` (a row already stored is a
 *    duplicate and changes nothing, so importing a file twice stores nothing new; one reading
 *    per instant, the first line wins), the rejected lines, and the import's final row with
 *    its live message — committed together.
 *
 * Imported readings never pass the alarm queue: the past raises no alarm and sends no mail.
 * They are readings, so reports count them. Progress goes to the import row and the shop's
 * live socket at most every 250 ms; a cancel (the row's status leaves "running") is seen
 * between chunks and rolls everything back.
 */
import pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';

import type { Db } from '@/db';
import { ensureReadingPartitionsWithin } from '@/db/queries/readingPartitions';
import { rollUpStoredSpan } from '@/db/queries/readingRollups';
import { drizzleOn } from '@/db/transaction';
import {
  claimImport,
  failImport,
  findImportById,
  importSensorIdentity,
  finishImport,
  insertRejects,
  recordProgress,
  type ImportCounts,
  type ImportRow,
} from '@/db/queries/imports';
import { LIVE_CHANNEL } from '@/db/notify';
import { planColumns } from '@/ingest';
import { IMPORT_ERRORS } from '@/ingest/words/importReasons';

import { isDatabaseUnavailable } from '../errors';
import type { Logger } from '../logger';
import { startSurfaceSeries } from '../readings/surfaceEstimates';
import { StorageUnavailableError, type Storage } from '../storage';
import { importMessageJson } from '../wire/imports';

import { restageInTimeOrder, stageFile, STAGE_COLUMNS, STAGE_TABLE } from './stage';

export interface ImportRunDeps {
  db: Db;
  pool: pg.Pool;
  storage: Storage;
  logger: Logger;
  /**
   * The database for the roll-up after an import: the server's small pool for long background
   * work (server/index.ts), so a year of roll-ups never takes a connection a request is waiting
   * for. `db` when unset (tests).
   */
  background?: Db;
  now?: () => number;
  /** Rows per COPY chunk (tests make it small to see the bound with a small file). */
  copyChunkRows?: number;
}

/** How an import that landed went: its counts and what it held in memory at most. */
export interface ImportOutcome {
  counts: ImportCounts;
  /** The file's accepted rows were in time order (derived as read, no second pass). */
  inOrder: boolean;
  /** The most readings held at once as COPY text not yet taken by the COPY. */
  peakRowsHeld: number;
  peakBytesHeld: number;
  /** The zone its readings were stored in (the sensor's at the time): what the roll-up scopes. */
  zoneId: string;
}

/** At most one progress message in this many ms while an import runs (the contract's 250). */
export const PROGRESS_INTERVAL_MS = 250;
/**
 * Rows per COPY chunk (~1.3 MB of COPY text): a cancel is seen between chunks, and the job
 * holds about three chunks at most (the one being built, one in the streams, one in the COPY).
 */
const COPY_CHUNK_ROWS = 10_000;

class Cancelled extends Error {}
class ImportFailure extends Error {
  constructor(
    readonly code: keyof typeof IMPORT_ERRORS,
    message: string,
  ) {
    super(message);
  }
}

/** Runs one import; how it landed, or null when it did not (cancelled, failed, not to run). */
export async function runImport(
  deps: ImportRunDeps,
  importId: string,
): Promise<ImportOutcome | null> {
  const now = deps.now ?? Date.now;
  const log = deps.logger.child({ component: 'jobs', importId });
  const row = await claimImport(deps.db, importId);
  if (!row) {
    // Cancelled before it ran: nothing to do but let go of the file.
    const gone = await findImportById(deps.db, importId);
    if (gone?.status === 'cancelled') await deps.storage.delete(gone.objectKey).catch(() => {});
    return null;
  }
  await publish(deps.pool, row);
  let landed: ImportOutcome | null = null;
  try {
    landed = await importFile(deps, row, now());
    if (landed === null) log.info('import: cancelled, nothing stored');
    else {
      const { counts, ...held } = landed;
      log.info({ ...counts, ...held }, 'import: done');
    }
  } catch (err) {
    if (err instanceof Cancelled) {
      log.info('import: cancelled, nothing stored');
      return null;
    }
    const failure =
      err instanceof ImportFailure
        ? err
        : err instanceof StorageUnavailableError
          ? new ImportFailure('import_storage', IMPORT_ERRORS.import_storage)
          : isDatabaseUnavailable(err)
            ? new ImportFailure('import_database', IMPORT_ERRORS.import_database)
            : new ImportFailure('import_failed', IMPORT_ERRORS.import_failed);
    if (failure.code === 'import_failed') log.error({ err }, 'import: failed');
    else log.warn({ err, code: failure.code }, 'import: failed');
    await failImport(
      deps.pool,
      importId,
      { code: failure.code, message: failure.message },
      importMessageJson,
      LIVE_CHANNEL,
    );
  } finally {
    // The file is kept until the import ends, whichever way it ended.
    await deps.storage.delete(row.objectKey).catch(() => {});
  }
  // Roll the imported hours up now, so long ranges show them at once: the import's zone only,
  // a week per statement. Should this fail, the roll-up job finds them within 5 minutes by
  // their arrival time.
  const span = landed?.counts;
  if (landed && span?.firstAt && span.lastAt) {
    const stored = { zoneId: landed.zoneId, sensorId: row.sensorId };
    await rollUpStoredSpan(deps.background ?? deps.db, {
      ...stored,
      from: span.firstAt,
      to: span.lastAt,
    }).catch((err: unknown) => log.warn({ err }, 'import: roll-up deferred to the roll-up job'));
  }
  return landed;
}

async function publish(pool: pg.Pool, row: ImportRow) {
  await pool.query('select pg_notify($1, $2)', [LIVE_CHANNEL, importMessageJson(row)]);
}

/** Progress at most every 250 ms; a write that finds the import no longer running means cancel. */
function progressTicker(deps: ImportRunDeps, importId: string, counts: ImportCounts) {
  let lastMs = 0;
  let inFlight: Promise<void> | null = null;
  let cancelled = false;
  const write = () => {
    inFlight = recordProgress(deps.pool, importId, counts, importMessageJson, LIVE_CHANNEL)
      .then((r) => {
        if (r === null) cancelled = true;
      })
      .catch(() => {})
      .finally(() => {
        inFlight = null;
      });
  };
  return {
    /**
     * Called often; writes when 250 ms have passed and no write is under way, or (`now`) once
     * the file is read whole, so the last read count shows while the rows are stored.
     */
    tick(now = false) {
      const t = Date.now();
      if (inFlight || (!now && t - lastMs < PROGRESS_INTERVAL_MS)) return;
      lastMs = t;
      write();
    },
    /** Throws Cancelled once a cancel has been seen. */
    check() {
      if (cancelled) throw new Cancelled();
    },
    async settle() {
      await inFlight;
    },
  };
}

/** The whole import; the final counts, or null when it was cancelled (nothing stored). */
async function importFile(
  deps: ImportRunDeps,
  row: ImportRow,
  nowMs: number,
): Promise<ImportOutcome | null> {
  const mapping = row.mapping;
  if (!mapping) throw new Error('import without a mapping was queued');
  const found = await importSensorIdentity(deps.db, row.shopId, row.sensorId);
  if (!found) throw new Error('the sensor of the import is gone');
  const sensor = found;
  const planned = planColumns(row.columns, mapping, row.delimiter);
  if (!planned.ok) throw new Error(`column ${planned.missing} missing at run time`);

  const counts: ImportCounts = {
    rowsRead: 0,
    rowsStored: 0,
    rowsDuplicate: 0,
    rowsRejected: 0,
    firstAt: null,
    lastAt: null,
  };
  const ticker = progressTicker(deps, row.id, counts);
  const object = await deps.storage.get(row.objectKey);
  if (!object) throw new ImportFailure('file_gone', IMPORT_ERRORS.file_gone);
  const stageOptions = {
    plan: planned.plan,
    delimiter: row.delimiter,
    nowMs,
    limits: { cautionK: sensor.cautionK, wetK: sensor.wetK },
    counts,
    ticker,
    startSeries: (firstAtMs: number) => startSurfaceSeries(deps.db, sensor.sensorId, firstAtMs),
    chunkRows: deps.copyChunkRows ?? COPY_CHUNK_ROWS,
  };

  // One transaction from the first line read to the last row stored, on a connection of its
  // own without the pool's request timeouts (a large file may take longer than any one web
  // request should): a fault or a cancel anywhere in the file rolls back everything.
  const client = new pg.Client({
    ...deps.pool.options,
    statement_timeout: undefined,
    query_timeout: undefined,
  });
  client.on('error', () => {});
  try {
    await client.connect();
    await client.query('begin');
    await client.query(STAGE_TABLE);
    // 1. Read, check and derive each line straight into the staging table.
    const staged = await stageFile(
      object.body,
      client.query(copyFrom('copy import_stage from stdin')),
      stageOptions,
    );
    ticker.check();
    await ticker.settle();
    ticker.tick(true);
    // 2. A file out of time order is derived again in time order, as a live batch is.
    if (!staged.inOrder) await restageInTimeOrder(client, stageOptions);
    ticker.check();
    // Months back (a logger's history) land in their own month's partition, never the default.
    if (counts.firstAt && counts.lastAt) {
      await ensureReadingPartitionsWithin(drizzleOn(client), counts.firstAt, counts.lastAt);
    }
    // 3. One set-based insert. No conflict target: it fits the (sensor_id, at) key and the
    // (shop_id, sensor_id, at) one. A row already stored is a duplicate and changes nothing.
    const inserted = await client.query(
      `insert into readings (sensor_id, at, shop_id, zone_id, ${STAGE_COLUMNS})
       select $1, timestamptz 'epoch' + at_ms * interval '1 millisecond', $2, $3, ${STAGE_COLUMNS}
       from ${staged.inOrder ? 'import_stage' : 'import_sorted'}
       on conflict do nothing`,
      [sensor.sensorId, sensor.shopId, sensor.zoneId],
    );
    counts.rowsStored = inserted.rowCount ?? 0;
    counts.rowsDuplicate = staged.accepted - counts.rowsStored;
    await insertRejects(client, row.id, staged.rejects);
    await ticker.settle();
    ticker.check();
    const finished = await finishImport(client, row.id, counts, importMessageJson, LIVE_CHANNEL);
    if (!finished) throw new Cancelled();
    await client.query('commit');
    return {
      counts,
      inOrder: staged.inOrder,
      peakRowsHeld: staged.peakRowsHeld,
      peakBytesHeld: staged.peakBytesHeld,
      zoneId: sensor.zoneId,
    };
  } catch (err) {
    object.body.destroy();
    await client.query('rollback').catch(() => {});
    if (err instanceof Cancelled) return null;
    throw err;
  } finally {
    await ticker.settle();
    await client.end().catch(() => {});
  }
}
