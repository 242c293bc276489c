/**
 * CSV import speed (`importVsCopy`): a logger's file of `rows` lines imported end to end — the
 * upload through the HTTP route, the start, the pg-boss job, stored — against a bare `COPY` of
 * the same file into a plain table with the same columns, in the same run. The two sides
 * alternate (COPY, import, COPY, import …) so a burst of someone else's work on this 2-core
 * machine lands on both; each import goes to a sensor of its own, so every one stores all of
 * its rows (a second import into the same sensor would store nothing new, a different job).
 */
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';

import pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';

import type { Import, ImportMapping } from '@/ingest/wire/imports';

import { call, signUp } from './fixtures';

/** The logger's zone: its local times cross two clock changes in a year of minutes. */
const LOGGER_ZONE = 'America/Chicago';
const HEADER = 'No,Local time,Air °C,RH %';
const MAPPING: ImportMapping = {
  timeColumn: 'Local time',
  airColumn: 'Air °C',
  rhColumn: 'RH %',
  surfaceColumn: null,
  temperatureUnit: 'C',
  timeFormat: 'iso',
  timeZone: LOGGER_ZONE,
};
/** How often the bench asks for the import's state: the end is seen within this. */
const POLL_MS = 50;

export interface ImportRun {
  /** Upload start → status done, the end-to-end figure. */
  totalMs: number;
  /** POST …/imports (multipart upload, checks, object storage) → 201. */
  uploadMs: number;
  /** POST …/start → 202. */
  startMs: number;
  /** 202 → the job has the import (status running): the queue's pickup. */
  queuedMs: number;
  /** running → every line read (rowsRead reaches the file's lines), as polled. */
  readMs: number;
  /** every line read → done: derivation, staging COPY, the insert, commit. */
  storeMs: number;
  rowsStored: number;
  rowsRejected: number;
}

export interface ImportSpeedResult {
  rows: number;
  fileBytes: number;
  imports: ImportRun[];
  copyMs: number[];
  floorMs: number[];
  /** Medians over the rounds. */
  importRowsPerS: number;
  copyRowsPerS: number;
  /** The same rows COPYed into a readings-shaped table with its indexes (the storage floor). */
  floorRowsPerS: number;
}

/**
 * A year of one-minute lines as a stand-alone logger writes them: a line number, the logger's
 * local wall time (the autumn hour twice, the spring hour never), air and RH with one decimal.
 */
export interface LoggerFile {
  text: string;
  rows: number;
  /** The same lines as readings rows (COPY text, readings' 13 columns): the floor's input. */
  stored: string;
}

export function loggerCsv(rows: number, endMs: number): LoggerFile {
  const minuteMs = 60_000;
  const startMs = Math.floor((endMs - rows * minuteMs) / 3_600_000) * 3_600_000;
  const parts = new Intl.DateTimeFormat('en-CA', {
    timeZone: LOGGER_ZONE,
    hourCycle: 'h23',
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
  });
  let hourPrefix = '';
  let hourOf = -1;
  const lines = [HEADER];
  const stored: string[] = [];
  // Made-up ids: the floor's table has no foreign keys, as readings has none.
  const ids = '00000000-0000-4000-8000-00000000000a';
  const idCells = `${ids}\t`;
  for (let i = 0; i < rows; i++) {
    const atMs = startMs + i * minuteMs;
    const hour = Math.floor(atMs / 3_600_000);
    if (hour !== hourOf) {
      // The zone's offsets change only on whole hours here, so the hour's wall prefix holds.
      const p = Object.fromEntries(parts.formatToParts(atMs).map((x) => [x.type, x.value]));
      hourPrefix = `${p.year}-${p.month}-${p.day} ${p.hour}:`;
      hourOf = hour;
    }
    const minute = String(i % 60).padStart(2, '0');
    const day = (2 * Math.PI * (atMs % 86_400_000)) / 86_400_000;
    const airC = 14 + 6 * Math.sin(day) + ((i * 7919) % 10) / 10;
    const rhPct = 62 - 15 * Math.sin(day) + ((i * 104_729) % 10) / 10;
    lines.push(`${i + 1},${hourPrefix}${minute}:00,${airC.toFixed(1)},${rhPct.toFixed(1)}`);
    // Derived columns with values of the usual width (dew point, estimated surface, margin, EMC).
    const at = new Date(atMs).toISOString();
    const dew = airC - 6.123456789012;
    stored.push(
      `${idCells}${at}\t${idCells}${idCells}${airC.toFixed(1)}\t${rhPct.toFixed(1)}\t${airC - 0.4}` +
        `\testimate\t\\N\t${dew}\t${airC - 0.4 - dew}\t${11 + (i % 7) / 3}\tdry`,
    );
  }
  return { text: `${lines.join('\n')}\n`, rows, stored: `${stored.join('\n')}\n` };
}

async function importSensor(url: string, cookie: string, shopId: string, zoneId: string) {
  const { body } = await call<{ id: string }>(
    url,
    `/shops/${shopId}/sensors`,
    { name: 'Bench logger', zoneId },
    cookie,
  );
  return body.id;
}

async function getImport(url: string, cookie: string, path: string): Promise<Import> {
  const res = await fetch(`${url}/api/v1${path}`, { headers: { cookie } });
  if (!res.ok) throw new Error(`GET ${path}: ${res.status} ${await res.text()}`);
  return ((await res.json()) as { import: Import }).import;
}

async function importOnce(
  url: string,
  cookie: string,
  shopId: string,
  sensorId: string,
  csv: Blob,
  lines: number,
): Promise<ImportRun> {
  const base = `/shops/${shopId}/sensors/${sensorId}/imports`;
  const t0 = performance.now();
  const form = new FormData();
  form.append('file', csv, 'logger-year.csv');
  const uploaded = await fetch(`${url}/api/v1${base}`, {
    method: 'POST',
    headers: { cookie, origin: url },
    body: form,
  });
  if (uploaded.status !== 201)
    throw new Error(`upload: ${uploaded.status} ${await uploaded.text()}`);
  const { import: row } = (await uploaded.json()) as { import: Import };
  const t1 = performance.now();
  await call(url, `${base}/${row.id}/start`, { mapping: MAPPING, remember: false }, cookie);
  const t2 = performance.now();
  let running: number | null = null;
  let read: number | null = null;
  for (;;) {
    const now = performance.now();
    const state = await getImport(url, cookie, `${base}/${row.id}`);
    if (running === null && state.status !== 'queued') running = now;
    if (read === null && (state.rowsRead >= lines || state.status === 'done')) read = now;
    if (state.status === 'done' && running !== null && read !== null) {
      const end = performance.now();
      return {
        totalMs: end - t0,
        uploadMs: t1 - t0,
        startMs: t2 - t1,
        queuedMs: running - t2,
        readMs: read - running,
        storeMs: end - read,
        rowsStored: state.rowsStored,
        rowsRejected: state.rowsRejected,
      };
    }
    if (state.status !== 'queued' && state.status !== 'running') {
      throw new Error(`import ended ${state.status}: ${JSON.stringify(state.error)}`);
    }
    await new Promise((resolve) => setTimeout(resolve, POLL_MS));
  }
}

/** The baseline: the same bytes through one COPY into a plain table of the file's columns. */
async function copyOnce(databaseUrl: string, csv: string): Promise<number> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    // The file's wall times are the logger's zone's, as the import reads them.
    await client.query(`set timezone = '${LOGGER_ZONE}'`);
    await client.query(
      `create table if not exists bench_import_copy
         (line integer, local_time timestamptz, air_c double precision, rh_pct double precision)`,
    );
    await client.query('truncate bench_import_copy');
    const t0 = performance.now();
    await pipeline(
      Readable.from([csv]),
      client.query(copyFrom('copy bench_import_copy from stdin (format csv, header true)')),
    );
    return performance.now() - t0;
  } finally {
    await client.end();
  }
}

/**
 * The floor: the same lines as readings rows, one COPY into a table shaped like readings with
 * its key and covering index (not partitioned, no staging, nothing derived): what storing the
 * rows costs before any of the import's own work.
 */
async function storeFloorOnce(databaseUrl: string, stored: string): Promise<number> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    await client.query(
      `create table if not exists bench_import_floor
         (like readings including defaults including indexes including constraints)`,
    );
    await client.query('truncate bench_import_floor');
    const t0 = performance.now();
    await pipeline(
      Readable.from([stored]),
      client.query(
        copyFrom(
          'copy bench_import_floor (sensor_id, at, shop_id, zone_id, air_c, rh_pct, surface_c, ' +
            'surface_source, battery_v, dew_point_c, margin_k, emc_pct, level) from stdin',
        ),
      ),
    );
    return performance.now() - t0;
  } finally {
    await client.end();
  }
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
};

export async function measureImportSpeed(opts: {
  url: string;
  databaseUrl: string;
  /**
   * The file, made before any connection is open: making it holds the event loop for seconds,
   * past the server's keep-alive, and fetch would then reuse a socket the server had closed.
   */
  file: LoggerFile;
  rounds: number;
  progress: (line: string) => void;
}): Promise<ImportSpeedResult> {
  const { text, rows } = opts.file;
  const csv = new Blob([text], { type: 'text/csv' });
  const cookie = await signUp(opts.url, 'Import bench owner');
  const post = <T>(path: string, body: unknown) =>
    call<T>(opts.url, path, body, cookie).then((r) => r.body);
  const shop = await post<{ id: string }>('/shops', {
    name: 'Tamarack Bench Shop',
    timeZone: LOGGER_ZONE,
  });
  const zone = await post<{ id: string }>(`/shops/${shop.id}/zones`, { name: 'Machine room' });

  const imports: ImportRun[] = [];
  const copyMs: number[] = [];
  const floorMs: number[] = [];
  for (let round = 0; round < opts.rounds; round++) {
    copyMs.push(await copyOnce(opts.databaseUrl, text));
    floorMs.push(await storeFloorOnce(opts.databaseUrl, opts.file.stored));
    const sensorId = await importSensor(opts.url, cookie, shop.id, zone.id);
    const run = await importOnce(opts.url, cookie, shop.id, sensorId, csv, rows);
    imports.push(run);
    opts.progress(
      `  round ${round + 1}: COPY ${copyMs.at(-1)!.toFixed(0)} ms, readings-shaped COPY ${floorMs.at(-1)!.toFixed(0)} ms, import ${run.totalMs.toFixed(0)} ms ` +
        `(upload ${run.uploadMs.toFixed(0)}, start ${run.startMs.toFixed(0)}, queued ` +
        `${run.queuedMs.toFixed(0)}, read ${run.readMs.toFixed(0)}, store ${run.storeMs.toFixed(0)}), ` +
        `${run.rowsStored} stored, ${run.rowsRejected} rejected`,
    );
  }
  const client = new pg.Client({ connectionString: opts.databaseUrl });
  await client.connect();
  await client.query('drop table if exists bench_import_copy, bench_import_floor');
  await client.end();
  return {
    rows: rows,
    fileBytes: csv.size,
    imports,
    copyMs,
    floorMs,
    importRowsPerS: rows / (median(imports.map((r) => r.totalMs)) / 1000),
    copyRowsPerS: rows / (median(copyMs) / 1000),
    floorRowsPerS: rows / (median(floorMs) / 1000),
  };
}
