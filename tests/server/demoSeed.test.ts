// The demo seed on a fresh database of its own with a real S3 API (s3rver), run twice: the
// surfaces, care log, finished trial and drawn photos are there after the first run, the second
// adds nothing, and once the demo sensors' two-week backfill is in (the simulator, through the
// real ingest route) the saw top's wax is due for renewal while the fresh coats are not.
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getTimezoneOffset } from 'date-fns-tz';
import { and, count, eq } from 'drizzle-orm';

import { createDatabase } from '@/db';
import { runMigrations } from '@/db/migrate';
import { careEntries, photos, surfaces, trialRanks, trialTests, trials } from '@/db/schema';
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_SHOP } from '@/db/seed';
import { DEMO_TRIAL } from '@/db/seedCareScenario';
import { DEFAULT_COATING_BUDGETS } from '@/ingest/care';
import type { SurfaceExposure, SurfacesResponse } from '@/ingest/wire/surfaces';
import type { Trial } from '@/ingest/wire/trials';
import { hashPassword } from '@/server/auth/password';
import { hashToken, newSensorToken } from '@/server/auth/sensorTokens';
import { DEMO_PHOTO_WIDTH_PX } from '@/server/demo/demoPhotos';
import { seedDemoShop } from '@/server/demo/seedShop';
import { startSimulator } from '@/server/demo/simulator';
import { createS3Storage } from '@/server/storage';

import { startInstance } from '../support/liveServer';
import { startS3Fake, type S3Fake } from '../support/s3';

const DB_NAME = `drybench_demo_${process.pid}`;
const adminUrl = process.env.DATABASE_URL!.replace(/\/[^/]+$/, '/postgres');
const demoUrl = process.env.DATABASE_URL!.replace(/\/[^/]+$/, `/${DB_NAME}`);
const credentials = { hashPassword, newToken: newSensorToken, hashToken };

let s3: S3Fake;
let server: Awaited<ReturnType<typeof startInstance>>;
const log: string[] = [];
let first: Awaited<ReturnType<typeof seedDemoShop>>;
let tokens: (typeof first)['tokens'] = [];
const simLog: string[] = [];

async function adminQuery(sql: string) {
  const admin = createDatabase(adminUrl, { max: 1 });
  try {
    await admin.pool.query(sql);
  } finally {
    await admin.pool.end();
  }
}

beforeAll(async () => {
  await adminQuery(`drop database if exists ${DB_NAME} with (force)`);
  await adminQuery(`create database ${DB_NAME}`);
  const migrator = createDatabase(demoUrl, { max: 1 });
  await runMigrations(migrator.db);
  await migrator.pool.end();
  s3 = await startS3Fake();
  server = await startInstance({
    databaseUrl: demoUrl,
    storage: s3.config,
    // The backfill posts two weeks in batches of 1,000 as fast as the server takes them.
    sensorRate: { ratePerS: 1000, burst: 1000 },
  });
  first = await seedDemoShop(server.app.db, credentials, {
    storage: createS3Storage(s3.config),
    nowMs: Date.now(),
    log: (line) => log.push(line),
  });
  tokens = first.tokens;
}, 120_000);

afterAll(async () => {
  await server?.close();
  await s3?.dispose();
  await adminQuery(`drop database if exists ${DB_NAME} with (force)`);
});

async function counts() {
  const db = server.app.db;
  const shopId = first.shopId;
  const n = async (
    table:
      | typeof surfaces
      | typeof careEntries
      | typeof trials
      | typeof trialTests
      | typeof trialRanks
      | typeof photos,
  ) => (await db.select({ n: count() }).from(table).where(eq(table.shopId, shopId)))[0]!.n;
  return {
    surfaces: await n(surfaces),
    careEntries: await n(careEntries),
    trials: await n(trials),
    trialTests: await n(trialTests),
    trialRanks: await n(trialRanks),
    photos: await n(photos),
    objects: (await s3.keys(`shops/${shopId}/photos/`)).length,
  };
}

async function ownerAgent() {
  const agent = request.agent(server.app.app);
  await agent
    .post('/api/v1/auth/sign-in')
    .send({ email: DEMO_PEOPLE[0].email, password: DEMO_PASSWORD })
    .expect(200);
  return agent;
}

describe('the demo seed', () => {
  it('adds surfaces, their care log, the trial and its photos once', async () => {
    expect(first.created).toBe(true);
    // db/seedCareScenario.ts: five surfaces (the lumber rack has none) with 11 entries between
    // them, one trial of 4 treatments × 6 tests; photos for the 6 tests and 3 inspections, two
    // objects each (full size and thumbnail).
    expect(first.care).toEqual({ surfaces: 5, careEntries: 11, trials: 1 });
    expect(first.photos).toBe(9);
    const before = await counts();
    expect(before).toEqual({
      surfaces: 5,
      careEntries: 11,
      trials: 1,
      trialTests: 6,
      trialRanks: 24,
      photos: 9,
      objects: 18,
    });

    const again = await seedDemoShop(server.app.db, credentials, {
      storage: createS3Storage(s3.config),
      // A later run (an hour on) still finds everything by name and adds nothing.
      nowMs: Date.now() + 3_600_000,
      log: (line) => log.push(line),
    });
    tokens = again.tokens;
    expect(again.created).toBe(false);
    expect(again.care).toEqual({ surfaces: 0, careEntries: 0, trials: 0 });
    expect(again.photos).toBe(0);
    expect(await counts()).toEqual(before);
    expect(log).toEqual([]);
  });

  it('skips photos without storage or with it away, never failing, and adds them next time', async () => {
    const db = server.app.db;
    // Take one inspection's photo away (row and objects), as if an earlier seed had no storage.
    const [gone] = await db
      .select()
      .from(photos)
      .where(and(eq(photos.shopId, first.shopId), eq(photos.ownerKind, 'care_entry')))
      .limit(1);
    const storage = createS3Storage(s3.config);
    await db.delete(photos).where(eq(photos.id, gone!.id));
    await storage.delete(gone!.objectKey);
    await storage.delete(gone!.thumbKey);
    const run = async (withStorage: boolean) => {
      const lines: string[] = [];
      const result = await seedDemoShop(db, credentials, {
        storage: withStorage ? storage : undefined,
        nowMs: Date.now(),
        log: (line) => lines.push(line),
      });
      tokens = result.tokens;
      return { photos: result.photos, lines };
    };

    expect(await run(false)).toEqual({
      photos: 0,
      lines: ['No photo storage configured (S3_BUCKET unset): the demo photos are skipped.'],
    });
    await s3.stop();
    try {
      expect(await run(true)).toEqual({
        photos: 0,
        lines: ['Photo storage is out of reach: 1 demo photo skipped; the next seed adds them.'],
      });
    } finally {
      await s3.start();
    }
    expect(await run(true)).toEqual({ photos: 1, lines: [] });
    const after = await counts();
    expect([after.photos, after.objects]).toEqual([9, 18]);
  });

  it('has a finished trial ranked in every test, with the standings worked by hand', async () => {
    const agent = await ownerAgent();
    const base = `/api/v1/shops/${first.shopId}/trials`;
    const list = (await agent.get(base).expect(200)).body.trials as { id: string; name: string }[];
    const trialId = list.find((x) => x.name === DEMO_TRIAL.name)!.id;
    const trial = (await agent.get(`${base}/${trialId}`).expect(200)).body as Trial;
    expect(trial.treatments.map((x) => x.name)).toEqual([...DEMO_TRIAL.treatments]);
    expect(trial.tests).toHaveLength(6);
    for (const test of trial.tests) {
      expect(test.ranks).toHaveLength(4);
      // Every test sits in the backfilled fortnight with a zone, so its conditions are read.
      expect(test.zoneId).not.toBeNull();
      expect(Date.parse(test.from)).toBeGreaterThan(Date.now() - 15 * 86_400_000);
      expect(Date.parse(test.to)).toBeLessThan(Date.now());
    }
    // Ranks by test (wax, dry film, inhibitor, bare), from the rusted shares of the scenario
    // (less rust ranks better, equal shares tie and share the average rank):
    //   2 3 1 4 | 1 3 2 4 | 2 1 3 4 | 2 3 1 4 | 1.5 3 1.5 4 | 2 3 1 4
    // Totals R = 10.5, 16, 9.5, 24; they sum to b·k(k+1)/2 = 6·4·5/2 = 60.
    const totals = trial.standings.rankTotals.map((r) => r.total);
    expect(totals).toEqual([10.5, 16, 9.5, 24]);
    expect(totals.reduce((a, b) => a + b, 0)).toBe(60);
    // Friedman with the tie correction (Conover, Practical Nonparametric Statistics, 3rd ed.,
    // section 5.8), b = 6 tests, k = 4 treatments, worked by hand:
    //   Σ (R_j − b(k+1)/2)² = (−4.5)² + 1² + (−5.5)² + 9² = 20.25 + 1 + 30.25 + 81 = 132.5
    //   A = Σ r² = 5 untied tests × 30 + (1.5² + 3² + 1.5² + 4²) = 150 + 29.5 = 179.5
    //   C = b·k(k+1)²/4 = 6·4·25/4 = 150
    //   T = (k − 1)·132.5 / (A − C) = 3·132.5 / 29.5 = 795/59 ≈ 13.4746, df = 3
    //   Kendall's W = T / (b(k − 1)) = (795/59) / 18 ≈ 0.7486
    // The chi-square (3 df) upper tail at 13.47 lies between the 0.005 point 12.838 and the
    // 0.001 point 16.266 of the usual table (e.g. NIST/SEMATECH e-Handbook, 1.3.6.7.4).
    expect(trial.standings.friedman!.statistic).toBeCloseTo(795 / 59, 10);
    expect(trial.standings.friedman!.df).toBe(3);
    expect(trial.standings.friedman!.p).toBeGreaterThan(0.001);
    expect(trial.standings.friedman!.p).toBeLessThan(0.005);
    expect(trial.standings.kendallW!).toBeCloseTo(795 / 59 / 18, 10);
    expect(trial.standings.verdict).toMatch(
      /^Inhibitor spray ranked best; the differences are more than chance/,
    );
  });

  it('stores its drawings as readable JPEGs without metadata, through the checked routes', async () => {
    const db = server.app.db;
    const rows = await db.select().from(photos).where(eq(photos.shopId, first.shopId));
    expect(rows.map((r) => r.ownerKind).sort()).toEqual([
      ...Array(3).fill('care_entry'),
      ...Array(6).fill('trial_test'),
    ]);
    const agent = await ownerAgent();
    const fullSize = new Map<string, Buffer>();
    for (const row of rows) {
      for (const suffix of ['', '/thumb']) {
        const res = await agent
          .get(`/api/v1/shops/${first.shopId}/photos/${row.id}${suffix}`)
          .buffer(true)
          .parse((r, done) => {
            const chunks: Buffer[] = [];
            r.on('data', (c: Buffer) => chunks.push(c));
            r.on('end', () => done(null, Buffer.concat(chunks)));
          })
          .expect(200);
        const bytes = res.body as Buffer;
        // JPEG's start-of-image marker (ITU T.81, B.1.1.3).
        expect(bytes.subarray(0, 3)).toEqual(Buffer.from([0xff, 0xd8, 0xff]));
        const meta = await sharp(bytes).metadata();
        expect(meta.format).toBe('jpeg');
        expect(meta.exif).toBeUndefined();
        // server/photos: a 320 px thumbnail; the drawing's own width fits the 2048 px cap.
        expect(meta.width).toBe(suffix ? 320 : DEMO_PHOTO_WIDTH_PX);
        if (!suffix) fullSize.set(row.id, bytes);
      }
    }
    // Drawn, not blank: in every test's panel the bare-iron coupon (the rightmost of four, from
    // x = 897 px) is redder than the inhibitor's (from x = 618 px), as its rusted share is larger.
    const redness = async (jpeg: Buffer, left: number) => {
      const { data } = await sharp(jpeg)
        .extract({ left, top: 200, width: 200, height: 450 })
        .raw()
        .toBuffer({ resolveWithObject: true });
      let sum = 0;
      for (let i = 0; i < data.length; i += 3) sum += data[i]! - data[i + 2]!;
      return sum / (data.length / 3);
    };
    for (const row of rows.filter((r) => r.ownerKind === 'trial_test')) {
      const jpeg = fullSize.get(row.id)!;
      expect(await redness(jpeg, 920)).toBeGreaterThan((await redness(jpeg, 640)) + 10);
    }
  });

  it('has the saw top due for a re-coat once the two-week backfill is in', async () => {
    const backfilled = new Promise<void>((resolve) => {
      const simulator = startSimulator({
        baseUrl: server.baseUrl,
        // Each run of the seed re-issues the sensor tokens: the newest are the valid ones.
        sensors: tokens,
        intervalMs: 3_600_000,
        speed: 1,
        backfillHours: 336,
        outage: null,
        utcOffsetHours: getTimezoneOffset(DEMO_SHOP.timeZone, new Date()) / 3_600_000,
        log: (line) => {
          simLog.push(line);
          if (line.includes('backfilled')) void simulator.stop().then(resolve);
        },
      });
    });
    await backfilled;
    // Nothing dropped (a refused batch is logged as "dropped …").
    expect(simLog).toEqual(['demo sensors: backfilled 336 h for 3 sensors']);
    const agent = await ownerAgent();
    const base = `/api/v1/shops/${first.shopId}/surfaces`;
    const list = (await agent.get(base).expect(200)).body as SurfacesResponse;
    // Listed in the scenario's order, the lumber rack without any.
    expect(list.surfaces.map((s) => s.name)).toEqual([
      'Table saw top',
      'Jointer beds',
      'Band saw table',
      'Hand-plane shelf',
      'Clamp rack',
    ]);
    const exposure = async (name: string) => {
      const s = list.surfaces.find((x) => x.name === name)!;
      return (await agent.get(`${base}/${s.id}/exposure`).expect(200)).body as SurfaceExposure;
    };
    // The demo weather wets the machine room's iron about 2 h each morning
    // (server/demo/dayModel.ts): nine mornings on the saw top's wax pass its 4 h budget
    // (ingest/care.ts, a rule of thumb of ours), one morning leaves the plane shelf's oil
    // (6 h) within budget (none at all when the seed ran before the morning).
    const saw = await exposure('Table saw top');
    expect(saw.coating).toBe('wax');
    expect(saw.hoursWet!).toBeGreaterThan(DEFAULT_COATING_BUDGETS.wax.hoursWet);
    expect(saw.recoat.due).toBe(true);
    const planes = await exposure('Hand-plane shelf');
    expect(planes.coating).toBe('oil');
    expect(planes.hoursWet!).toBeLessThanOrEqual(DEFAULT_COATING_BUDGETS.oil.hoursWet);
    expect(planes.recoat.due).toBe(false);
  }, 120_000);
});
