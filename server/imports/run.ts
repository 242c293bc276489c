/**
 * The import job: one uploaded file becomes one sensor's readings, whole or not at all.
 *
 * 1. Stream the object from storage through papaparse (already a dependency; SETUP-NOTES
 *    measured it faster than csv-parse on this machine — not re-measured here), reading each line through the chosen columns (ingest/importRows.ts)
 *    and the live checks (ingest/derive.ts `deriveAir`): rejected lines are kept with their
 *    line numbers and reasons.
 * 2. Derive every accepted reading exactly as a live batch is derived
 *    (server/readings/prepare.ts): one reading per instant (the first wins), the surface
 *    estimate over the readings in time order (rebuilt from the stored readings before them),
 *    then the margin and level with the zone's limits.
 * 3. In ONE transaction: COPY the rows into a temporary staging table, one
 *    `insert into readings select … on conflict do nothing` (a row already stored is a
 *    duplicate and changes nothing, so importing a file twice stores nothing new), the rejected
 *    lines, and the import's final row with its live message — committed together.
 *
 * Imported readings never pass the alarm queue: the past raises no alarm and sends no mail.
 * They are readings, so reports count them. Progress goes to the import row and the shop's
 * live socket at most every 250 ms; a cancel (the row's status leaves "running") is seen
 * between chunks and rolls everything back.
 */
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';

import Papa from 'papaparse';
import pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';

import type { Db } from '@/db';
import { ensureReadingPartitionsWithin } from '@/db/queries/readingPartitions';
import { rollUpRange } from '@/db/queries/readingRollups';
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
import {
  deriveAir,
  deriveMargin,
  planColumns,
  readImportRow,
  resolveFold,
  rowReasonOf,
} from '@/ingest';
import { IMPORT_ERRORS, IMPORT_ROW_REASONS } from '@/ingest/words/importReasons';
import type { ImportRowReason } from '@/ingest/words/importReasons';

import { isDatabaseUnavailable } from '../errors';
import type { Logger } from '../logger';
import { createSurfaceEstimator } from '../readings/surfaceEstimates';
import { StorageUnavailableError, type Storage } from '../storage';
import { importMessageJson } from '../wire/imports';

export interface ImportRunDeps {
  db: Db;
  pool: pg.Pool;
  storage: Storage;
  logger: Logger;
  now?: () => number;
}

/** At most one progress message in this many ms while an import runs (the contract's 250). */
export const PROGRESS_INTERVAL_MS = 250;
/** Rows per COPY chunk: a cancel is seen between chunks. */
const COPY_CHUNK_ROWS = 10_000;
/** A rejected line as kept for rejected.csv. */
const REJECT_ROW_CHARS = 500;

class Cancelled extends Error {}
class ImportFailure extends Error {
  constructor(
    readonly code: keyof typeof IMPORT_ERRORS,
    message: string,
  ) {
    super(message);
  }
}

/** The accepted readings in file order, columns apart (500k rows stay a few tens of MB). */
interface Accepted {
  line: number[];
  atMs: number[];
  airC: number[];
  rhPct: number[];
  /** NaN: no surface value on that line. */
  surfaceC: number[];
  dewPointC: number[];
  emcPct: (number | null)[];
}

/**
 * The staging table holds what differs from row to row; the sensor, shop and zone are the same
 * for every row of a file and go into the insert as parameters, and the time travels as epoch
 * ms. That is half the bytes the client formats and COPY parses (three UUIDs and an ISO time a
 * row were ~110 of ~250 bytes), and a number is cheaper to write than `toISOString()`.
 */
const STAGE_TABLE = `create temporary table import_stage (
  at_ms bigint not null, air_c double precision not null, rh_pct double precision not null,
  surface_c double precision, surface_source surface_source, dew_point_c double precision,
  margin_k double precision, emc_pct double precision, level level not null
) on commit drop`;
const STAGE_COLUMNS =
  'air_c, rh_pct, surface_c, surface_source, dew_point_c, margin_k, emc_pct, level';

/** COPY's text format: the values here are numbers and enum words (no escapes needed). */
const copyNumber = (v: number | null) => (v === null ? '\\N' : String(v));

export async function runImport(deps: ImportRunDeps, importId: string): Promise<void> {
  const now = deps.now ?? Date.now;
  const log = deps.logger.child({ component: 'jobs', importId });
  const row = await claimImport(deps.db, importId);
  if (!row) {
    // Cancelled before it ran: nothing to do but let go of the file.
    const gone = await findImportById(deps.db, importId);
    if (gone?.status === 'cancelled') await deps.storage.delete(gone.objectKey).catch(() => {});
    return;
  }
  await publish(deps.pool, row);
  let landed: ImportCounts | null = null;
  try {
    const counts = await importFile(deps, row, now());
    if (counts === null) log.info('import: cancelled, nothing stored');
    else log.info(counts, 'import: done');
    landed = counts;
  } catch (err) {
    if (err instanceof Cancelled) {
      log.info('import: cancelled, nothing stored');
      return;
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
  // Roll the imported hours up now, so long ranges show them at once; should this fail, the
  // roll-up job finds them within 5 minutes by their arrival time.
  if (landed?.firstAt && landed.lastAt) {
    await rollUpRange(deps.db, landed.firstAt, landed.lastAt).catch((err: unknown) =>
      log.warn({ err }, 'import: roll-up deferred to the roll-up job'),
    );
  }
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
): Promise<ImportCounts | null> {
  const mapping = row.mapping;
  if (!mapping) throw new Error('import without a mapping was queued');
  const found = await importSensorIdentity(deps.db, row.shopId, row.sensorId);
  if (!found) throw new Error('the sensor of the import is gone');
  const sensor = found;
  const planned = planColumns(row.columns, mapping, row.delimiter);
  if (!planned.ok) throw new Error(`column ${planned.missing} missing at run time`);
  const plan = planned.plan;

  const counts: ImportCounts = {
    rowsRead: 0,
    rowsStored: 0,
    rowsDuplicate: 0,
    rowsRejected: 0,
    firstAt: null,
    lastAt: null,
  };
  const ticker = progressTicker(deps, row.id, counts);
  const rejects: { line: number; reason: string; row: string }[] = [];
  const acc: Accepted = {
    line: [],
    atMs: [],
    airC: [],
    rhPct: [],
    surfaceC: [],
    dewPointC: [],
    emcPct: [],
  };
  const seenMs = new Set<number>();
  let previousMs: number | null = null;
  let minMs = Infinity;
  let maxMs = -Infinity;

  const reject = (line: number, reason: ImportRowReason, cells: string[]) => {
    counts.rowsRejected++;
    const text = Papa.unparse([cells], { delimiter: row.delimiter, newline: '' });
    rejects.push({
      line,
      reason: IMPORT_ROW_REASONS[reason],
      row: text.slice(0, REJECT_ROW_CHARS),
    });
  };

  // 1. Stream and read.
  const object = await deps.storage.get(row.objectKey);
  if (!object) throw new ImportFailure('file_gone', IMPORT_ERRORS.file_gone);
  object.body.setEncoding('utf8');
  let recordNo = 0;
  await new Promise<void>((resolve, reject_) => {
    let failed: unknown = null;
    Papa.parse<string[]>(object.body, {
      delimiter: row.delimiter,
      chunkSize: 1 << 20,
      chunk(results, parser) {
        try {
          for (const cells of results.data) {
            recordNo++;
            if (recordNo === 1) continue; // the header
            if (cells.length === 1 && cells[0]!.trim() === '') continue; // a blank line
            counts.rowsRead++;
            const verdict = readImportRow(cells, plan);
            if (!verdict.ok) {
              reject(recordNo, verdict.reason, cells);
              continue;
            }
            const atMs = resolveFold(verdict.time, previousMs);
            previousMs = atMs;
            const checked = deriveAir({ atMs, ...verdict.reading }, nowMs);
            if (!checked.ok) {
              reject(recordNo, rowReasonOf(checked.rejection), cells);
              continue;
            }
            if (atMs < minMs) minMs = atMs;
            if (atMs > maxMs) maxMs = atMs;
            // The same instant twice in the file is a duplicate, as in a live batch: the first wins.
            if (seenMs.has(atMs)) {
              counts.rowsDuplicate++;
              continue;
            }
            seenMs.add(atMs);
            acc.line.push(recordNo);
            acc.atMs.push(atMs);
            acc.airC.push(verdict.reading.airC);
            acc.rhPct.push(verdict.reading.rhPct);
            acc.surfaceC.push(verdict.reading.surfaceC ?? NaN);
            acc.dewPointC.push(checked.air.dewPointC);
            acc.emcPct.push(checked.air.emcPct);
          }
          if (Number.isFinite(minMs)) {
            counts.firstAt = new Date(minMs);
            counts.lastAt = new Date(maxMs);
          }
          ticker.tick();
          ticker.check();
        } catch (err) {
          failed = err;
          parser.abort();
        }
      },
      complete: () => (failed ? reject_(failed) : resolve()),
      error: (err: Error) => reject_(failed ?? err),
    });
  });
  ticker.check();
  await ticker.settle();
  ticker.tick(true);

  // 2. Derive in time order, as a live batch is.
  const n = acc.atMs.length;
  const order = Array.from({ length: n }, (_, i) => i);
  order.sort((a, b) => acc.atMs[a]! - acc.atMs[b]!);
  let estimates: number[] = [];
  if (acc.surfaceC.some((s) => Number.isNaN(s))) {
    const estimator = createSurfaceEstimator(deps.db);
    estimates = await estimator.estimate(
      sensor.sensorId,
      order.map((i) => ({ atMs: acc.atMs[i]!, airC: acc.airC[i]! })),
    );
  }
  const limits = { cautionK: sensor.cautionK, wetK: sensor.wetK };
  function* copyLines(): Generator<string> {
    let chunk = '';
    for (let k = 0; k < n; k++) {
      const i = order[k]!;
      const probe = !Number.isNaN(acc.surfaceC[i]!);
      const surfaceC = probe ? acc.surfaceC[i]! : (estimates[k] ?? null);
      const d = deriveMargin(
        { dewPointC: acc.dewPointC[i]!, emcPct: acc.emcPct[i]! },
        surfaceC,
        limits,
      );
      const source = probe ? 'probe' : surfaceC === null ? '\\N' : 'estimate';
      chunk +=
        `${acc.atMs[i]!}\t${acc.airC[i]!}\t${acc.rhPct[i]!}\t${copyNumber(surfaceC)}\t${source}\t` +
        `${copyNumber(d.dewPointC)}\t${copyNumber(d.marginK)}\t${copyNumber(d.emcPct)}\t${d.level}\n`;
      if ((k + 1) % COPY_CHUNK_ROWS === 0) {
        ticker.check();
        yield chunk;
        chunk = '';
      }
    }
    if (chunk) yield chunk;
  }

  // 3. One transaction, on a connection of its own without the pool's request timeouts: a
  // large file may take longer than any one web request should.
  const client = new pg.Client({
    ...deps.pool.options,
    statement_timeout: undefined,
    query_timeout: undefined,
  });
  await client.connect();
  client.on('error', () => {});
  try {
    await client.query('begin');
    await client.query(STAGE_TABLE);
    await pipeline(
      Readable.from(copyLines()),
      client.query(copyFrom('copy import_stage from stdin')),
    );
    ticker.check();
    // Months back (a logger's history) land in their own month's partition, never the default.
    if (counts.firstAt && counts.lastAt) {
      await ensureReadingPartitionsWithin(drizzleOn(client), counts.firstAt, counts.lastAt);
    }
    // No conflict target: it fits the (sensor_id, at) key and the (shop_id, sensor_id, at) one.
    const inserted = await client.query(
      `insert into readings (sensor_id, at, shop_id, zone_id, ${STAGE_COLUMNS})
       select $1, timestamptz 'epoch' + at_ms * interval '1 millisecond', $2, $3, ${STAGE_COLUMNS}
       from import_stage
       on conflict do nothing`,
      [sensor.sensorId, sensor.shopId, sensor.zoneId],
    );
    counts.rowsStored = inserted.rowCount ?? 0;
    counts.rowsDuplicate += n - counts.rowsStored;
    await insertRejects(client, row.id, rejects);
    await ticker.settle();
    ticker.check();
    const finished = await finishImport(client, row.id, counts, importMessageJson, LIVE_CHANNEL);
    if (!finished) throw new Cancelled();
    await client.query('commit');
    return counts;
  } catch (err) {
    await client.query('rollback').catch(() => {});
    if (err instanceof Cancelled) return null;
    throw err;
  } finally {
    await ticker.settle();
    await client.end().catch(() => {});
  }
}
