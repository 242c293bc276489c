/**
 * The read of an import as one stream into the staging table: papaparse's rows → the checks and
 * the derivation → COPY text in chunks of `chunkRows` → `copy import_stage from stdin`. Nothing
 * waits for the whole file: a row is held only until its chunk has gone to the COPY, and the
 * COPY's back-pressure (the socket to PostgreSQL) holds the parser, so a 500,000-line file
 * keeps a few chunks in memory instead of every accepted row (it held all of them until
 * 2026-12-02, 530 MB peak RSS).
 *
 * The surface estimate needs the readings in time order. A logger writes its file in time
 * order, so each row is derived as it is read. A file found out of order (a row earlier than
 * the one before it) is still staged row by row; `restageInTimeOrder` then re-derives the
 * staged rows in time order in chunks, through a cursor, into a second staging table.
 */
import { Readable, Transform, type Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';

import Papa from 'papaparse';
import type pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';

import type { ImportCounts } from '@/db/queries/imports';
import {
  deriveAir,
  deriveMargin,
  readImportRow,
  resolveFold,
  rowReasonOf,
  type AirSample,
  type ColumnPlan,
  type MarginLimits,
} from '@/ingest';
import { IMPORT_ROW_REASONS } from '@/ingest/words/importReasons';
import type { ImportRowReason } from '@/ingest/words/importReasons';

/** A rejected line as kept for rejected.csv. */
const REJECT_ROW_CHARS = 500;
/** Rows between two looks at the clock for progress and cancel. */
const TICK_ROWS = 1024;

/**
 * The staging table holds what differs from row to row; the sensor, shop and zone are the same
 * for every row of a file and go into the insert as parameters, and the time travels as epoch
 * ms (half the bytes of three UUIDs and an ISO time a row). `line` orders a file's repeated
 * instants (the first wins) when the file is out of time order.
 */
export const STAGE_TABLE = `create temporary table import_stage (
  line integer not null, at_ms bigint not null, air_c double precision not null,
  rh_pct double precision not null, surface_c double precision, surface_source surface_source,
  dew_point_c double precision, margin_k double precision, emc_pct double precision,
  level level not null
) on commit drop`;
/** The same rows once in time order, without repeats (out-of-order files only). */
const SORTED_TABLE = `create temporary table import_sorted (
  at_ms bigint not null, air_c double precision not null, rh_pct double precision not null,
  surface_c double precision, surface_source surface_source, dew_point_c double precision,
  margin_k double precision, emc_pct double precision, level level not null
) on commit drop`;
/** The staged columns the insert into readings takes. */
export const STAGE_COLUMNS =
  'air_c, rh_pct, surface_c, surface_source, dew_point_c, margin_k, emc_pct, level';

/** COPY's text format: the values here are numbers and enum words (no escapes needed). */
const copyNumber = (v: number | null) => (v === null ? '\\N' : String(v));

/** Starts the surface estimate at a file's first reading (server/readings/surfaceEstimates.ts). */
export type StartSurfaceSeries = (firstAtMs: number) => Promise<(sample: AirSample) => number>;

interface Ticker {
  tick(): void;
  check(): void;
}

export interface StageOptions {
  plan: ColumnPlan;
  delimiter: string;
  nowMs: number;
  limits: MarginLimits;
  counts: ImportCounts;
  ticker: Ticker;
  startSeries: StartSurfaceSeries;
  chunkRows: number;
}

export interface StageResult {
  rejects: { line: number; reason: string; row: string }[];
  /** Rows that passed the checks, repeats of an instant included. */
  accepted: number;
  /** Every accepted row later than the one before it: staged rows are final. */
  inOrder: boolean;
  /** The most readings the job held at once as COPY text not yet taken by the COPY. */
  peakRowsHeld: number;
  /** The same in bytes (chunk being built + stream buffers up to the COPY). */
  peakBytesHeld: number;
}

/** The file's line ending from its first text, as papaparse guesses it; null: not seen yet. */
function lineEnding(text: string): '\n' | '\r\n' | '\r' | null {
  const n = text.indexOf('\n');
  const r = text.indexOf('\r');
  if (n === -1 && r === -1) return null;
  if (r === -1 || (n !== -1 && n < r)) return '\n';
  if (r + 1 === text.length) return null; // a CR at the end: is an LF next?
  return text[r + 1] === '\n' ? '\r\n' : '\r';
}

/** One staged line of COPY text, in STAGE_TABLE's order after `line`. */
function stageLine(
  atMs: number,
  airC: number,
  rhPct: number,
  probeC: number | null,
  estimateC: number,
  air: { dewPointC: number; emcPct: number | null },
  limits: MarginLimits,
) {
  const probe = probeC !== null;
  const surfaceC = probe ? probeC : estimateC;
  const d = deriveMargin(air, surfaceC, limits);
  const source = probe ? 'probe' : 'estimate';
  return (
    `${atMs}\t${airC}\t${rhPct}\t${copyNumber(surfaceC)}\t${source}\t` +
    `${copyNumber(d.dewPointC)}\t${copyNumber(d.marginK)}\t${copyNumber(d.emcPct)}\t${d.level}\n`
  );
}

/**
 * Reads `body` into the staging table through `copy` (a `copy import_stage from stdin` stream
 * on the import's transaction). Throws whatever the ticker throws (a cancel), the storage's or
 * the COPY's error; the caller rolls back.
 */
export async function stageFile(
  body: Readable,
  copy: Writable,
  o: StageOptions,
): Promise<StageResult> {
  const { counts } = o;
  const result: StageResult = {
    rejects: [],
    accepted: 0,
    inOrder: true,
    peakRowsHeld: 0,
    peakBytesHeld: 0,
  };
  let recordNo = 0;
  let previousMs: number | null = null;
  let lastAcceptedMs: number | null = null;
  let minMs = Infinity;
  let maxMs = -Infinity;
  let series: ((sample: AirSample) => number) | null = null;
  let chunk = '';
  let chunkRows = 0;
  // Chunks handed on and not yet taken by the COPY: their end in bytes pushed, and their rows.
  const inFlight: { endByte: number; rows: number }[] = [];
  let pushedBytes = 0;

  const setSpan = () => {
    if (Number.isFinite(minMs)) {
      counts.firstAt = new Date(minMs);
      counts.lastAt = new Date(maxMs);
    }
  };
  const reject = (line: number, reason: ImportRowReason, cells: string[]) => {
    counts.rowsRejected++;
    const text = Papa.unparse([cells], { delimiter: o.delimiter, newline: '' });
    result.rejects.push({
      line,
      reason: IMPORT_ROW_REASONS[reason],
      row: text.slice(0, REJECT_ROW_CHARS),
    });
  };

  // Papa's low-level parser over each text chunk as it arrives: every complete row of the
  // chunk at once, the rest kept for the next. (Papa's Node stream hands on one row at a time
  // and, held by back-pressure, splits the rest of its chunk again on every resume: quadratic
  // in the chunk behind a slow COPY.)
  let parser: Papa.Parser | null = null;
  let partial = '';
  const stage = new Transform({
    decodeStrings: false,
    transform(text: string, _encoding, done) {
      const whole = partial + text;
      if (!parser) {
        const newline = lineEnding(whole);
        if (newline === null) {
          partial = whole;
          done();
          return;
        }
        parser = new Papa.Parser({ delimiter: o.delimiter, newline });
      }
      let rows: string[][];
      try {
        const parsed = parser.parse(whole, 0, true) as {
          data: string[][];
          meta: { cursor: number };
        };
        rows = parsed.data;
        partial = whole.substring(parsed.meta.cursor);
      } catch (err) {
        done(err as Error);
        return;
      }
      readRows(rows, 0, done);
    },
    flush(done) {
      const rest = partial;
      partial = '';
      const last = rest
        ? ((
            parser ?? new Papa.Parser({ delimiter: o.delimiter, newline: lineEnding(rest) ?? '\n' })
          ).parse(rest, 0, false) as { data: string[][] })
        : { data: [] };
      readRows(last.data, 0, (err) => {
        if (err) return done(err);
        setSpan();
        if (chunkRows > 0) push();
        done();
      });
    },
  });

  /** Reads rows[from…], waiting where a row must (the estimate's start), then calls `done`. */
  function readRows(rows: string[][], from: number, done: (err?: Error | null) => void) {
    try {
      for (let i = from; i < rows.length; i++) {
        const pending = readRow(rows[i]!);
        if (pending) {
          pending.then(() => readRows(rows, i + 1, done), done);
          return;
        }
      }
      done();
    } catch (err) {
      done(err as Error);
    }
  }

  function push() {
    // Held at this moment: the chunk about to go and those handed on that the COPY has not yet
    // taken (what it took sits in its socket's buffer: at most about one chunk more, as
    // pg-copy-streams waits for that socket to drain before it takes the next).
    const taken = pushedBytes - stage.readableLength - copy.writableLength;
    while (inFlight.length > 0 && inFlight[0]!.endByte <= taken) inFlight.shift();
    let rows = chunkRows;
    for (const c of inFlight) rows += c.rows;
    result.peakRowsHeld = Math.max(result.peakRowsHeld, rows);
    result.peakBytesHeld = Math.max(result.peakBytesHeld, pushedBytes - taken + chunk.length);
    pushedBytes += chunk.length; // ASCII: characters are bytes
    inFlight.push({ endByte: pushedBytes, rows: chunkRows });
    stage.push(chunk);
    chunk = '';
    chunkRows = 0;
  }

  /** A promise only when the row must wait (the estimate's start at the first accepted row). */
  function readRow(cells: string[]): Promise<void> | undefined {
    recordNo++;
    if (recordNo === 1) return; // the header
    if (cells.length === 1 && cells[0]!.trim() === '') return; // a blank line
    counts.rowsRead++;
    if (counts.rowsRead % TICK_ROWS === 0) {
      setSpan();
      o.ticker.tick();
      o.ticker.check();
    }
    const verdict = readImportRow(cells, o.plan);
    if (!verdict.ok) {
      reject(recordNo, verdict.reason, cells);
      return;
    }
    const atMs = resolveFold(verdict.time, previousMs);
    previousMs = atMs;
    const checked = deriveAir({ atMs, ...verdict.reading }, o.nowMs);
    if (!checked.ok) {
      reject(recordNo, rowReasonOf(checked.rejection), cells);
      return;
    }
    if (atMs < minMs) minMs = atMs;
    if (atMs > maxMs) maxMs = atMs;
    result.accepted++;
    if (lastAcceptedMs !== null && atMs <= lastAcceptedMs) {
      // The same instant as the line before is a duplicate, as in a live batch: the first wins.
      // An earlier one puts the file out of order: the insert sorts the repeats out.
      if (atMs === lastAcceptedMs) {
        counts.rowsDuplicate++;
        return;
      }
      result.inOrder = false;
    }
    lastAcceptedMs = atMs;
    const { airC, rhPct } = verdict.reading;
    const probeC = verdict.reading.surfaceC ?? null;
    if (series) {
      addRow(series, recordNo, atMs, airC, rhPct, probeC, checked.air);
      return;
    }
    const line = recordNo;
    return o.startSeries(atMs).then((step) => {
      series = step;
      addRow(step, line, atMs, airC, rhPct, probeC, checked.air);
    });
  }

  function addRow(
    step: (sample: AirSample) => number,
    line: number,
    atMs: number,
    airC: number,
    rhPct: number,
    probeC: number | null,
    air: { dewPointC: number; emcPct: number | null },
  ) {
    // Stepped over every reading, probe or not, as `estimate` is over a live batch.
    const estimateC = step({ atMs, airC });
    chunk += `${line}\t${stageLine(atMs, airC, rhPct, probeC, estimateC, air, o.limits)}`;
    if (++chunkRows === o.chunkRows) {
      push();
      o.ticker.check();
    }
  }

  body.setEncoding('utf8');
  await pipeline(body, stage, copy);
  setSpan();
  return result;
}

/**
 * For a file out of time order: the staged rows in time order, the first line of each instant
 * only, re-derived (the surface estimate from the earliest reading on) into `import_sorted`,
 * `chunkRows` at a time through a cursor. The caller inserts from `import_sorted`.
 */
export async function restageInTimeOrder(
  client: pg.Client,
  o: Pick<StageOptions, 'limits' | 'ticker' | 'startSeries' | 'chunkRows'>,
): Promise<void> {
  await client.query(SORTED_TABLE);
  await client.query(
    `declare import_rows no scroll cursor for
     select distinct on (at_ms) at_ms, air_c, rh_pct,
       case when surface_source = 'probe' then surface_c end as probe_c, dew_point_c, emc_pct
     from import_stage order by at_ms, line`,
  );
  let step: ((sample: AirSample) => number) | null = null;
  for (;;) {
    const { rows } = await client.query<{
      at_ms: string;
      air_c: number;
      rh_pct: number;
      probe_c: number | null;
      dew_point_c: number;
      emc_pct: number | null;
    }>(`fetch ${o.chunkRows} from import_rows`);
    if (rows.length === 0) break;
    step ??= await o.startSeries(Number(rows[0]!.at_ms));
    let text = '';
    for (const r of rows) {
      const atMs = Number(r.at_ms);
      const air = { dewPointC: r.dew_point_c, emcPct: r.emc_pct };
      const estimateC = step({ atMs, airC: r.air_c });
      text += stageLine(atMs, r.air_c, r.rh_pct, r.probe_c, estimateC, air, o.limits);
    }
    await pipeline(Readable.from([text]), client.query(copyFrom('copy import_sorted from stdin')));
    o.ticker.check();
  }
  await client.query('close import_rows');
}
