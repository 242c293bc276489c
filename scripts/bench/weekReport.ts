/**
 * The week report's cost: a shop of 10 zones, one sensor each, with a reading every minute for
 * the whole of last week (10 × 10,080 = 100,800 readings), then GET …/reports/week over HTTP as
 * the app asks for it — JSON, and PDF once a renderer is there. Readings go in straight through
 * insertReadingGroup (unnest INSERTs of 5,000): the ingest route's cost is measured elsewhere.
 */
import { createDatabase } from '@/db';
import { insertReadingGroup, type ReadingRow } from '@/db/queries/readings';
import { deriveReading } from '@/ingest/derive';
import { lastCompleteWeekStart, weekBounds } from '@/ingest/reportWeek';

import { rollupRunsBetween } from './rollupRuns';
import { percentile } from './stats';

const ZONES = 10;
const MINUTE_MS = 60_000;
const INSERT_BATCH = 5000;
const JSON_SAMPLES = 40;
const PDF_SAMPLES = 10;

export interface WeekReportBench {
  readings: number;
  insertS: number;
  jsonP95Ms: number;
  jsonP50Ms: number;
  pdfP95Ms: number | null;
  /** Why the PDF was not measured (e.g. the renderer is not there yet), else null. */
  pdfNote: string | null;
  /**
   * Seconds the server's roll-up job ran while the JSON report was timed: a run then re-rolls
   * the week just inserted (received now) on the same two cores.
   */
  rollupJobS: number;
}

async function api<T>(url: string, path: string, cookie: string, body?: unknown): Promise<T> {
  const res = await fetch(`${url}/api/v1${path}`, {
    method: body === undefined ? 'GET' : 'POST',
    headers: { 'content-type': 'application/json', origin: url, cookie },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (!res.ok) throw new Error(`${path}: ${res.status} ${await res.text()}`);
  return (await res.json()) as T;
}

/** One reading a minute: a daily swing of the air, humid nights, the iron lagging a little. */
function readingAt(atMs: number, zone: number) {
  const day = (atMs / (24 * 60 * MINUTE_MS)) * 2 * Math.PI;
  const airC = 12 + 6 * Math.sin(day + zone / 3);
  const rhPct = Math.min(99, 70 - 15 * Math.sin(day + zone / 3));
  const surfaceC = 12 + 6 * Math.sin(day + zone / 3 - 0.5) + 1;
  return { airC, rhPct, surfaceC, ...deriveReading({ airC, rhPct, surfaceC }) };
}

async function timed(url: string, path: string, cookie: string) {
  const started = performance.now();
  const res = await fetch(`${url}${path}`, { headers: { cookie, origin: url } });
  const bytes = (await res.arrayBuffer()).byteLength;
  return { ms: performance.now() - started, status: res.status, bytes };
}

export async function benchWeekReport(spec: {
  url: string;
  databaseUrl: string;
  /** A signed-in owner's `name=value` session cookie. */
  cookie: string;
  progress: (line: string) => void;
}): Promise<WeekReportBench> {
  const { url, cookie } = spec;
  const shop = await api<{ id: string }>(url, '/shops', cookie, {
    name: 'Report shop',
    timeZone: 'UTC',
  });
  const sensors: { sensorId: string; zoneId: string }[] = [];
  for (let z = 0; z < ZONES; z++) {
    const zone = await api<{ id: string }>(url, `/shops/${shop.id}/zones`, cookie, {
      name: `Zone ${z + 1}`,
    });
    const sensor = await api<{ id: string }>(url, `/shops/${shop.id}/sensors`, cookie, {
      name: `Sensor ${z + 1}`,
      zoneId: zone.id,
    });
    sensors.push({ sensorId: sensor.id, zoneId: zone.id });
  }

  const start = lastCompleteWeekStart(Date.now(), 'UTC');
  const week = weekBounds(start, 'UTC');
  spec.progress(`inserting a week of 1-minute readings for ${ZONES} zones…`);
  const { pool } = createDatabase(spec.databaseUrl, { max: 2 });
  const insertStarted = performance.now();
  let readings = 0;
  try {
    let batch: ReadingRow[] = [];
    for (let atMs = week.fromMs; atMs < week.toMs; atMs += MINUTE_MS) {
      sensors.forEach((s, z) => {
        const r = readingAt(atMs, z);
        batch.push({
          sensorId: s.sensorId,
          shopId: shop.id,
          zoneId: s.zoneId,
          at: new Date(atMs),
          airC: r.airC,
          rhPct: r.rhPct,
          surfaceC: r.surfaceC,
          surfaceSource: 'probe',
          batteryV: null,
          dewPointC: r.dewPointC,
          marginK: r.marginK,
          emcPct: r.emcPct,
          level: r.level,
        });
      });
      if (batch.length >= INSERT_BATCH) {
        readings += (await insertReadingGroup(pool, batch, [])).size;
        batch = [];
      }
    }
    if (batch.length > 0) readings += (await insertReadingGroup(pool, batch, [])).size;
    // As a live database would have it: the planner's statistics know the new rows.
    await pool.query('analyze readings');
  } finally {
    await pool.end();
  }
  const insertS = (performance.now() - insertStarted) / 1000;

  const path = `/api/v1/shops/${shop.id}/reports/week?start=${start}`;
  spec.progress(`GET the week report (JSON) ${JSON_SAMPLES} times…`);
  for (let i = 0; i < 3; i++) await timed(url, path, cookie);
  const jsonMs: number[] = [];
  const timedFromMs = Date.now();
  for (let i = 0; i < JSON_SAMPLES; i++) {
    const r = await timed(url, path, cookie);
    if (r.status !== 200) throw new Error(`week report answered ${r.status}`);
    jsonMs.push(r.ms);
  }
  jsonMs.sort((a, b) => a - b);
  const jobPool = createDatabase(spec.databaseUrl, { max: 1 }).pool;
  const job = await rollupRunsBetween(jobPool, timedFromMs, Date.now()).finally(() =>
    jobPool.end(),
  );
  spec.progress(`  roll-up job running during the timing: ${job.seconds.toFixed(1)} s`);

  spec.progress('GET the week report (PDF)…');
  let pdfP95Ms: number | null = null;
  let pdfNote: string | null = null;
  const first = await timed(url, `${path}&format=pdf`, cookie);
  if (first.status !== 200) {
    pdfNote = `the PDF route answered ${first.status}: the renderer (server/reports/pdf.ts) is not merged yet`;
  } else {
    const pdfMs: number[] = [];
    for (let i = 0; i < PDF_SAMPLES; i++)
      pdfMs.push((await timed(url, `${path}&format=pdf`, cookie)).ms);
    pdfMs.sort((a, b) => a - b);
    pdfP95Ms = percentile(pdfMs, 95);
  }
  return {
    readings,
    insertS,
    jsonP95Ms: percentile(jsonMs, 95),
    jsonP50Ms: percentile(jsonMs, 50),
    pdfP95Ms,
    pdfNote,
    rollupJobS: job.seconds,
  };
}
