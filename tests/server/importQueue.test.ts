// The CSV import queue around the imports themselves (issue 14): uploads never started are let
// go after a day, and one shop's pile of imports does not stand in front of another shop's.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { IMPORT_EXPIRY_CRON, IMPORT_EXPIRY_QUEUE, scheduleUploadExpiry } from '@/server/jobs';
import { expireStaleUploads, UPLOAD_KEEP_MS } from '@/server/imports/expire';
import { createS3Storage } from '@/server/storage';
import type { Import, ImportMapping } from '@/ingest/wire/imports';

import { ownerWithSensor } from '../support/app';
import {
  importsPath,
  startImportWorld,
  upload,
  waitForEnd,
  type ImportWorld,
} from '../support/imports';

let w: ImportWorld;
beforeAll(async () => {
  // Not working the queue yet: the fairness test queues everything first.
  w = await startImportWorld('pgboss_import_queue', { work: false });
});
afterAll(() => w.close());

const MAPPING: ImportMapping = {
  timeColumn: 'time',
  airColumn: 'air',
  rhColumn: 'rh',
  surfaceColumn: null,
  temperatureUnit: 'C',
  timeFormat: 'epoch-s',
  timeZone: 'UTC',
};

/** `n` one-minute lines from 2025-03-01T00:00Z. */
const file = (n: number) =>
  ['time,air,rh', ...Array.from({ length: n }, (_, i) => `${1740787200 + i * 60},15.5,62`)].join(
    '\n',
  );

describe('uploads never started', () => {
  it('are cancelled after the keep time and their files deleted; fresh ones stay', async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const base = importsPath(o.shopId, o.sensorId);
    const old = (await upload(o.agent, base, file(5)).expect(201)).body.import as Import;
    const fresh = (await upload(o.agent, base, file(5)).expect(201)).body.import as Import;
    // The first was uploaded a day and a minute ago.
    await w.t.pool.query(
      `update imports set created_at = now() - make_interval(secs => $2) where id = $1`,
      [old.id, UPLOAD_KEEP_MS / 1000 + 60],
    );
    const prefix = `shops/${o.shopId}/imports/`;
    expect(await w.s3.keys(prefix)).toHaveLength(2);

    const deps = { pool: w.t.pool, storage: createS3Storage(w.s3.config), logger: w.t.logger };
    expect(await expireStaleUploads(deps, Date.now())).toBe(1);

    const gone = (await o.agent.get(`${base}/${old.id}`).expect(200)).body.import as Import;
    expect(gone).toMatchObject({ status: 'cancelled', error: { code: 'upload_expired' } });
    expect(gone.finishedAt).not.toBeNull();
    expect(await w.s3.keys(prefix)).toEqual([`${prefix}${fresh.id}.csv`]);
    const kept = (await o.agent.get(`${base}/${fresh.id}`).expect(200)).body.import as Import;
    expect(kept.status).toBe('uploaded');
    // The expired one can no longer be started; the fresh one still can be.
    const refused = await o.agent
      .post(`${base}/${old.id}/start`)
      .send({ mapping: MAPPING, remember: false })
      .expect(409);
    expect(refused.body.error.code).toBe('import_not_pending');
    // Run again: nothing more to let go.
    expect(await expireStaleUploads(deps, Date.now())).toBe(0);
  });

  it('are swept by an hourly schedule', async () => {
    await scheduleUploadExpiry(w.boss, {
      pool: w.t.pool,
      storage: createS3Storage(w.s3.config),
      logger: w.t.logger,
    });
    const schedules = await w.boss.getSchedules();
    expect(schedules.find((s) => s.name === IMPORT_EXPIRY_QUEUE)?.cron).toBe(IMPORT_EXPIRY_CRON);
  });
});

describe('two shops importing at once', () => {
  it("another shop's import runs beside a shop's pile of imports, not after it", async () => {
    const a = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const b = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const queue = async (o: typeof a, lines: number) => {
      const base = importsPath(o.shopId, o.sensorId);
      const up = (await upload(o.agent, base, file(lines)).expect(201)).body.import as Import;
      await o.agent
        .post(`${base}/${up.id}/start`)
        .send({ mapping: MAPPING, remember: false })
        .expect(202);
      return { o, path: `${base}/${up.id}` };
    };
    // Shop A queues three files first, then shop B one; nothing is worked yet. (A's files are
    // the same lines: the later ones store nothing new, but each is read and checked whole.)
    const piled = [await queue(a, 10_000), await queue(a, 10_000), await queue(a, 10_000)];
    const other = await queue(b, 2_000);
    await w.work();
    const [a1, a2, a3] = await Promise.all(
      piled.map((p) => waitForEnd(p.o.agent, p.path, 120_000)),
    );
    const b1 = await waitForEnd(other.o.agent, other.path, 120_000);
    expect([a1, a2, a3, b1].map((x) => x!.status)).toEqual(['done', 'done', 'done', 'done']);
    expect(b1.rowsStored).toBe(2_000);
    // First come per shop, but B's first import goes before A's second and third: with two
    // workers it runs beside A's first, so it ends before A's second does (FIFO alone would
    // run A's first two together and B's only after one of them).
    const at = (x: Import) => Date.parse(x.finishedAt!);
    expect(at(b1)).toBeLessThan(at(a2!));
    expect(at(b1)).toBeLessThan(at(a3!));
  }, 180_000);
});
