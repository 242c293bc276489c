// The import job reads a file as a stream into its staging COPY (server/imports/stage.ts): what
// it holds stays a few chunks whatever the file's length, a file out of time order still lands
// exactly as the live ingest route derives the same readings, and a fault mid-file — after rows
// have already gone into the staging COPY — stores nothing. The jobs are run here directly
// (the pg-boss worker is not started) so each test sees the job's outcome and can give it a
// small COPY chunk or a storage that breaks.
import { Transform } from 'node:stream';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runImport, type ImportRunDeps } from '@/server/imports/run';
import { silentLogger } from '@/server/logger';
import { createS3Storage, type Storage } from '@/server/storage';

import { ownerWithSensor } from '../support/app';
import { postIngest } from '../support/ingest';
import {
  importsPath,
  ISO_MAPPING as MAPPING,
  startImportWorld,
  upload,
  type ImportWorld,
} from '../support/imports';

let w: ImportWorld;
let storage: Storage;
beforeAll(async () => {
  w = await startImportWorld('pgboss_imports_stream', { work: false });
  storage = createS3Storage(w.s3.config);
});
afterAll(() => w.close());

const deps = (extra: Partial<ImportRunDeps> = {}): ImportRunDeps => ({
  db: w.t.db,
  pool: w.t.pool,
  storage,
  logger: silentLogger(),
  ...extra,
});

/** Uploads and starts a file (queued, not worked); its import id. */
async function queued(
  o: Awaited<ReturnType<typeof ownerWithSensor>>,
  content: string,
  sensorId = o.sensorId,
) {
  const base = importsPath(o.shopId, sensorId);
  const up = await upload(o.agent, base, content).expect(201);
  const id = up.body.import.id as string;
  await o.agent.post(`${base}/${id}/start`).send({ mapping: MAPPING, remember: false }).expect(202);
  return id;
}

/** `n` readings a minute apart from 2025-03-01T00:00Z; every third without a probe value. */
function series(n: number) {
  const startMs = Date.UTC(2025, 2, 1);
  return Array.from({ length: n }, (_, i) => ({
    at: new Date(startMs + i * 60_000).toISOString(),
    air: Math.round((14 + 4 * Math.sin(i / 9)) * 10) / 10,
    rh: Math.round((70 + 10 * Math.cos(i / 7)) * 10) / 10,
    surface: i % 3 === 0 ? null : Math.round((12 + 3 * Math.sin(i / 11)) * 10) / 10,
  }));
}
type Row = ReturnType<typeof series>[number];
const csvOf = (rows: Row[]) =>
  ['time,air,rh,surface', ...rows.map((r) => `${r.at},${r.air},${r.rh},${r.surface ?? ''}`)].join(
    '\n',
  );

async function storedRows(sensorId: string) {
  const { rows } = await w.t.pool.query(
    `select at, air_c, rh_pct, surface_c, surface_source, dew_point_c, margin_k, emc_pct, level
     from readings where sensor_id = $1 order by at`,
    [sensorId],
  );
  return rows;
}

async function statusOf(id: string) {
  const { rows } = await w.t.pool.query('select status from imports where id = $1', [id]);
  return rows[0].status as string;
}

describe('the import as a stream', () => {
  it('holds a few COPY chunks of a long file, not its rows', async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const lines = 10_000;
    const id = await queued(o, csvOf(series(lines)));
    const chunkRows = 200;
    const outcome = await runImport(deps({ copyChunkRows: chunkRows }), id);
    expect(outcome?.counts).toMatchObject({ rowsRead: lines, rowsStored: lines, rowsRejected: 0 });
    expect(outcome!.inOrder).toBe(true);
    // The chunk being built, one waiting in the stream, one in the COPY's buffer: holding every
    // accepted row until the COPY (as the job did before) would be all 10,000 here.
    expect(outcome!.peakRowsHeld).toBeGreaterThanOrEqual(chunkRows);
    expect(outcome!.peakRowsHeld).toBeLessThanOrEqual(4 * chunkRows);
    expect(outcome!.peakBytesHeld).toBeLessThan(4 * chunkRows * 200);
    expect(await statusOf(id)).toBe('done');
  }, 120_000);

  it('derives a file out of time order as the live route derives the same readings', async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const live = await o.agent
      .post(`/api/v1/shops/${o.shopId}/sensors`)
      .send({ name: 'Live twin', zoneId: o.zoneId })
      .expect(201);
    const rows = series(90);
    // The reference: the readings posted in time order to /api/v1/ingest, derived live.
    await postIngest(w.t.app, live.body.token, {
      unit: 'C',
      readings: rows.map((r) => ({ at: r.at, air: r.air, rh: r.rh, surface: r.surface })),
    }).expect(202);
    // The file: the last 30 minutes first, then the first 60, and one instant again with other
    // values after its first line (the first line wins, as in a live batch).
    const repeat = { ...rows[40]!, air: 30, rh: 20 };
    const shuffled = [...rows.slice(60), ...rows.slice(0, 45), repeat, ...rows.slice(45, 60)];
    const id = await queued(o, csvOf(shuffled));
    // Chunks of 7 rows: the time-ordered pass carries the estimate across cursor fetches.
    const outcome = await runImport(deps({ copyChunkRows: 7 }), id);
    expect(outcome!.inOrder).toBe(false);
    expect(outcome!.counts).toMatchObject({ rowsRead: 91, rowsStored: 90, rowsDuplicate: 1 });
    const imported = await storedRows(o.sensorId);
    expect(imported.filter((r) => r.surface_source === 'estimate')).toHaveLength(30);
    // Equal to the last bit: the same functions on the same numbers in the same order.
    expect(imported).toEqual(await storedRows(live.body.id));
  }, 60_000);

  it('stores nothing when the file breaks off after rows went into the COPY', async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const text = csvOf(series(5_000));
    const id = await queued(o, text);
    let passed = 0;
    // The stored object's stream fails past half of the file, as a dropped connection would.
    const breaking: Storage = {
      ...storage,
      async get(key) {
        const object = await storage.get(key);
        if (!object) return null;
        const cut = new Transform({
          transform(bytes: Buffer, _encoding, done) {
            passed += bytes.length;
            if (passed > text.length / 2) done(new Error('connection reset'));
            else done(null, bytes);
          },
        });
        return { ...object, body: object.body.pipe(cut) };
      },
    };
    const outcome = await runImport(deps({ storage: breaking, copyChunkRows: 100 }), id);
    expect(outcome).toBeNull();
    expect(passed).toBeGreaterThan(text.length / 2);
    expect(await statusOf(id)).toBe('failed');
    expect(await storedRows(o.sensorId)).toEqual([]);
    // The file is let go of, as after any end.
    expect(await w.s3.keys(`shops/${o.shopId}/imports/${id}`)).toEqual([]);
  }, 60_000);
});
