// Photos of care entries and trial tests: the subject paths of API.md, the subject check (a
// care entry or trial test of this shop, on the surface or in the trial the path names), the
// `photos` lists of a surface's care log and a trial's tests, and deleting a photo. Real HTTP,
// a real S3 API (s3rver on loopback) and the real database; images are made here with sharp.
import { randomUUID } from 'node:crypto';

import { count, eq } from 'drizzle-orm';
import request from 'supertest';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { photos } from '@/db/schema';
import { PHOTO_MAX_BYTES } from '@/server/photos';

import { makeTestApp, type TestApp } from '../support/app';
import { binaryBody } from '../support/binary';
import { errorShape } from '../support/errorShape';
import { startS3Fake, type S3Fake } from '../support/s3';
import { makeWorld, type World } from '../support/tenants';

let s3: S3Fake;
let t: TestApp;
let w: World;
let base: string;
/** Two surfaces of shop A, an entry on each; an entry of shop B; shop B's own test. */
let surfaceId: string;
let entryId: string;
let otherSurfaceId: string;
let otherEntryId: string;
let foreignSurfaceId: string;
let foreignEntryId: string;

const solid = (widthPx: number, heightPx: number, background = '#7a4f2a') =>
  sharp({ create: { width: widthPx, height: heightPx, channels: 3, background } });

async function surfaceWithEntry(shopId: string, zoneId: string, cookie: string, name: string) {
  const surface = await request(t.app)
    .post(`/api/v1/shops/${shopId}/surfaces`)
    .set('Cookie', cookie)
    .send({ name, zoneId })
    .expect(201);
  const entry = await request(t.app)
    .post(`/api/v1/shops/${shopId}/surfaces/${surface.body.id}/care`)
    .set('Cookie', cookie)
    .send({ kind: 'inspection', at: '2026-02-03T08:00:00Z', rusting: 2 })
    .expect(201);
  return { surfaceId: surface.body.id as string, entryId: entry.body.id as string };
}

beforeAll(async () => {
  s3 = await startS3Fake();
  t = makeTestApp({ storage: s3.config });
  w = await makeWorld(t);
  base = `/api/v1/shops/${w.a.id}`;
  ({ surfaceId, entryId } = await surfaceWithEntry(
    w.a.id,
    w.a.zone.id,
    w.member.cookie,
    'Saw top',
  ));
  ({ surfaceId: otherSurfaceId, entryId: otherEntryId } = await surfaceWithEntry(
    w.a.id,
    w.a.zone.id,
    w.member.cookie,
    'Jointer bed',
  ));
  ({ surfaceId: foreignSurfaceId, entryId: foreignEntryId } = await surfaceWithEntry(
    w.b.id,
    w.b.zone.id,
    w.stranger.cookie,
    'Band saw table',
  ));
});
afterAll(async () => {
  await t.pool.end();
  await s3.dispose();
});

const carePath = (surface: string, entry: string) =>
  `${base}/surfaces/${surface}/care/${entry}/photos`;
const testPath = (trial: string, test: string) => `${base}/trials/${trial}/tests/${test}/photos`;

const post = (path: string, bytes: Buffer, cookie = w.member.cookie, filename = 'top.jpg') =>
  request(t.app)
    .post(path)
    .set('Cookie', cookie)
    .attach('photo', bytes, { filename, contentType: 'image/jpeg' });

function expectError(res: request.Response, status: number, code: string) {
  expect({ status: res.status, code: res.body?.error?.code }, res.text.slice(0, 300)).toEqual({
    status,
    code,
  });
  expect(res.body).toMatchObject(errorShape);
}

/** Rows and objects of every shop: a refused upload must change neither. */
async function stored() {
  const [row] = await t.db.select({ n: count() }).from(photos);
  return { rows: row!.n, objects: (await s3.keys('shops/')).length };
}

describe('photos of a care entry', () => {
  it('stores one under its entry and lists the entry’s photos oldest first', async () => {
    // 1600×1200 fits inside 2048 as it is: kept at its size (never enlarged).
    const first = await post(
      carePath(surfaceId, entryId),
      await solid(1600, 1200).jpeg().toBuffer(),
    ).expect(201);
    expect(first.body).toEqual({
      id: first.body.id,
      url: `${base}/photos/${first.body.id}`,
      thumbUrl: `${base}/photos/${first.body.id}/thumb`,
      widthPx: 1600,
      heightPx: 1200,
      addedById: w.member.id,
    });
    const second = await post(
      carePath(surfaceId, entryId),
      await solid(300, 400, '#405060').png().toBuffer(),
      w.owner.cookie,
      'close-up.png',
    ).expect(201);
    const [row] = await t.db.select().from(photos).where(eq(photos.id, second.body.id));
    expect([row!.ownerKind, row!.ownerId]).toEqual(['care_entry', entryId]);

    const detail = await request(t.app)
      .get(`${base}/surfaces/${surfaceId}`)
      .set('Cookie', w.viewer.cookie)
      .expect(200);
    const entry = detail.body.care.find((c: { id: string }) => c.id === entryId);
    expect(entry.photos).toEqual([first.body, second.body]);
    // The other surface's entry has none of them.
    const other = await request(t.app)
      .get(`${base}/surfaces/${otherSurfaceId}`)
      .set('Cookie', w.viewer.cookie)
      .expect(200);
    expect(other.body.care.map((c: { photos: unknown[] }) => c.photos)).toEqual([[]]);
    // A new entry answers with an empty list, not a missing key.
    const fresh = await request(t.app)
      .post(`${base}/surfaces/${surfaceId}/care`)
      .set('Cookie', w.member.cookie)
      .send({ kind: 'inspection', at: '2026-02-04T08:00:00Z', rusting: 0 })
      .expect(201);
    expect(fresh.body.photos).toEqual([]);
    // The listed URL serves the stored JPEG (SOI marker FF D8, ISO/IEC 10918-1 B.1.1.2).
    const thumb = await request(t.app)
      .get(entry.photos[0].thumbUrl)
      .set('Cookie', w.viewer.cookie)
      .buffer(true)
      .parse(binaryBody)
      .expect(200);
    expect([...(thumb.body as Buffer).subarray(0, 2)]).toEqual([0xff, 0xd8]);
    // 1600×1200 inside 320: 320 × 240.
    expect(await sharp(thumb.body as Buffer).metadata()).toMatchObject({ width: 320, height: 240 });
  });
});

describe('photos of a trial test', () => {
  it('stores one under its test and lists it with the trial and in the ranks answer', async () => {
    const res = await post(
      testPath(w.a.trial.id, w.a.test.id),
      await solid(640, 480).jpeg().toBuffer(),
    ).expect(201);
    const trial = await request(t.app)
      .get(`${base}/trials/${w.a.trial.id}`)
      .set('Cookie', w.viewer.cookie)
      .expect(200);
    const test = trial.body.tests.find((x: { id: string }) => x.id === w.a.test.id);
    expect(test.photos).toEqual([res.body]);
    const ranked = await request(t.app)
      .put(`${base}/trials/${w.a.trial.id}/tests/${w.a.test.id}/ranks`)
      .set('Cookie', w.member.cookie)
      .send({ ranks: w.a.trial.treatments.map((x, i) => ({ treatmentId: x.id, rank: i + 1 })) })
      .expect(200);
    expect(ranked.body.photos).toEqual([res.body]);
    const added = await request(t.app)
      .post(`${base}/trials/${w.a.trial.id}/tests`)
      .set('Cookie', w.member.cookie)
      .send({
        name: 'Humid week',
        kind: 'humid_storage',
        from: '2026-02-01T00:00:00Z',
        to: '2026-02-08T00:00:00Z',
      })
      .expect(201);
    expect(added.body.photos).toEqual([]);
  });

  it('lists the photos of many tests in one trial answer, each under its own test', async () => {
    const ids: string[] = [];
    const tests: string[] = [];
    for (const [i, day] of ['10', '11', '12'].entries()) {
      const test = await request(t.app)
        .post(`${base}/trials/${w.a.trial.id}/tests`)
        .set('Cookie', w.member.cookie)
        .send({
          name: `Wet rag ${i}`,
          kind: 'standing_liquid',
          from: `2026-02-${day}T06:00:00Z`,
          to: `2026-02-${day}T18:00:00Z`,
        })
        .expect(201);
      tests.push(test.body.id);
      const photo = await post(
        testPath(w.a.trial.id, test.body.id),
        await solid(40 + i, 30)
          .jpeg()
          .toBuffer(),
      ).expect(201);
      ids.push(photo.body.id);
    }
    const trial = await request(t.app)
      .get(`${base}/trials/${w.a.trial.id}`)
      .set('Cookie', w.owner.cookie)
      .expect(200);
    const byTest = new Map(
      trial.body.tests.map((x: { id: string; photos: { id: string }[] }) => [
        x.id,
        x.photos.map((p) => p.id),
      ]),
    );
    expect(tests.map((id) => byTest.get(id))).toEqual(ids.map((id) => [id]));
  });
});

/** How many statements the app sends while answering one GET (counted on the pool). */
async function statementsFor(path: string): Promise<number> {
  const pool = t.pool as unknown as { query: (...args: unknown[]) => unknown };
  const real = pool.query;
  let n = 0;
  pool.query = function (this: unknown, ...args: unknown[]) {
    n += 1;
    return real.apply(this, args);
  };
  try {
    await request(t.app).get(path).set('Cookie', w.owner.cookie).expect(200);
  } finally {
    pool.query = real;
  }
  return n;
}

describe('listing photos costs one query, whatever the number of subjects', () => {
  it('answers a trial with one photographed test and with four in as many statements', async () => {
    const trial = (
      await request(t.app)
        .post(`${base}/trials`)
        .set('Cookie', w.member.cookie)
        .send({ name: 'Statement count', treatments: ['Wax', 'Oil'] })
        .expect(201)
    ).body as { id: string };
    const addTest = async (day: number) => {
      const test = await request(t.app)
        .post(`${base}/trials/${trial.id}/tests`)
        .set('Cookie', w.member.cookie)
        // No zone: the conditions during a test are read per zoned test, which is not counted here.
        .send({
          name: `Day ${day}`,
          kind: 'wear',
          from: `2026-02-0${day}T08:00:00Z`,
          to: `2026-02-0${day}T17:00:00Z`,
        })
        .expect(201);
      await post(testPath(trial.id, test.body.id), await solid(30, 20).jpeg().toBuffer()).expect(
        201,
      );
    };
    await addTest(1);
    const one = await statementsFor(`${base}/trials/${trial.id}`);
    for (const day of [2, 3, 4]) await addTest(day);
    const four = await statementsFor(`${base}/trials/${trial.id}`);
    expect(one).toBeGreaterThan(0);
    expect(four).toBe(one);
  });

  it('answers a surface with one photographed entry and with four in as many statements', async () => {
    const { surfaceId: id, entryId: first } = await surfaceWithEntry(
      w.a.id,
      w.a.zone.id,
      w.member.cookie,
      'Outfeed table',
    );
    await post(carePath(id, first), await solid(30, 20).jpeg().toBuffer()).expect(201);
    const one = await statementsFor(`${base}/surfaces/${id}`);
    for (const day of ['05', '06', '07']) {
      const entry = await request(t.app)
        .post(`${base}/surfaces/${id}/care`)
        .set('Cookie', w.member.cookie)
        .send({ kind: 'inspection', at: `2026-02-${day}T08:00:00Z`, rusting: 1 })
        .expect(201);
      await post(carePath(id, entry.body.id), await solid(30, 20).jpeg().toBuffer()).expect(201);
    }
    const four = await statementsFor(`${base}/surfaces/${id}`);
    expect(one).toBeGreaterThan(0);
    expect(four).toBe(one);
  });
});

describe('photo subject corpus: refused, and nothing stored', () => {
  const jpeg = () => solid(64, 48).jpeg().toBuffer();
  const text = () => Promise.resolve(Buffer.from('Waxed the top on Friday. Not an image.\n'));
  const oversize = () => {
    // A JPEG start-of-image marker padded past the limit by one byte.
    const big = Buffer.alloc(PHOTO_MAX_BYTES + 1, 0x20);
    big.set([0xff, 0xd8, 0xff, 0xe0], 0);
    return Promise.resolve(big);
  };
  // [what, path, bytes, status, code]
  const CASES: [string, () => string, () => Promise<Buffer>, number, string][] = [
    [
      'another shop’s care entry under this shop’s surface',
      () => carePath(surfaceId, foreignEntryId),
      jpeg,
      404,
      'care_entry_not_found',
    ],
    [
      'another shop’s surface and entry',
      () => carePath(foreignSurfaceId, foreignEntryId),
      jpeg,
      404,
      'care_entry_not_found',
    ],
    [
      'an entry of another surface of this shop',
      () => carePath(surfaceId, otherEntryId),
      jpeg,
      404,
      'care_entry_not_found',
    ],
    [
      'an entry id of nothing',
      () => carePath(surfaceId, randomUUID()),
      jpeg,
      404,
      'care_entry_not_found',
    ],
    [
      'an entry id that is no UUID',
      () => carePath(surfaceId, 'entry-1'),
      jpeg,
      404,
      'care_entry_not_found',
    ],
    [
      'a surface id that is no UUID',
      () => carePath('top', entryId),
      jpeg,
      404,
      'care_entry_not_found',
    ],
    [
      'another shop’s test in this shop’s trial',
      () => testPath(w.a.trial.id, w.b.test.id),
      jpeg,
      404,
      'trial_test_not_found',
    ],
    [
      'another shop’s trial and test',
      () => testPath(w.b.trial.id, w.b.test.id),
      jpeg,
      404,
      'trial_test_not_found',
    ],
    [
      'a test id of nothing',
      () => testPath(w.a.trial.id, randomUUID()),
      jpeg,
      404,
      'trial_test_not_found',
    ],
    [
      'a test id that is no UUID',
      () => testPath(w.a.trial.id, '7'),
      jpeg,
      404,
      'trial_test_not_found',
    ],
    [
      'a text file named .jpg on an entry',
      () => carePath(surfaceId, entryId),
      text,
      415,
      'unsupported_media_type',
    ],
    [
      'a text file named .jpg on a test',
      () => testPath(w.a.trial.id, w.a.test.id),
      text,
      415,
      'unsupported_media_type',
    ],
    [
      'a file over 10 MiB on an entry',
      () => carePath(surfaceId, entryId),
      oversize,
      413,
      'photo_too_large',
    ],
    [
      'a file over 10 MiB on a test',
      () => testPath(w.a.trial.id, w.a.test.id),
      oversize,
      413,
      'photo_too_large',
    ],
  ];

  it.each(CASES)('%s', async (_what, path, bytes, status, code) => {
    const before = await stored();
    expectError(await post(path(), await bytes()), status, code);
    expect(await stored()).toEqual(before);
  });

  it('refuses another shop’s entry or test named in the generic route’s fields', async () => {
    const before = await stored();
    for (const [kind, id, code] of [
      ['care_entry', foreignEntryId, 'care_entry_not_found'],
      ['trial_test', w.b.test.id, 'trial_test_not_found'],
    ] as const) {
      const res = await request(t.app)
        .post(`${base}/photos`)
        .set('Cookie', w.member.cookie)
        .field('subjectKind', kind)
        .field('subjectId', id)
        .attach('photo', await jpeg(), 'x.jpg');
      expectError(res, 404, code);
    }
    expect(await stored()).toEqual(before);
  });

  it('refuses subject fields on a path that already names the subject', async () => {
    const before = await stored();
    const res = await request(t.app)
      .post(carePath(surfaceId, entryId))
      .set('Cookie', w.member.cookie)
      .field('subjectKind', 'trial_test')
      .attach('photo', await jpeg(), 'x.jpg');
    expectError(res, 400, 'invalid_input');
    expect(await stored()).toEqual(before);
  });

  it('asks for the photo when the form has none', async () => {
    const res = await request(t.app)
      .post(testPath(w.a.trial.id, w.a.test.id))
      .set('Cookie', w.member.cookie)
      .send({ photo: 'x' });
    expectError(res, 400, 'invalid_input');
  });
});

describe('deleting a photo', () => {
  const add = async (cookie: string) =>
    (
      await post(
        testPath(w.a.trial.id, w.a.test.id),
        await solid(120, 90).jpeg().toBuffer(),
        cookie,
      ).expect(201)
    ).body as { id: string; url: string };
  const remove = (id: string, cookie: string) =>
    request(t.app).delete(`${base}/photos/${id}`).set('Cookie', cookie);
  const keysOf = (id: string) => s3.keys(`shops/${w.a.id}/photos/${id}`);
  const listed = async () => {
    const trial = await request(t.app)
      .get(`${base}/trials/${w.a.trial.id}`)
      .set('Cookie', w.owner.cookie)
      .expect(200);
    return trial.body.tests
      .find((x: { id: string }) => x.id === w.a.test.id)
      .photos.map((p: { id: string }) => p.id) as string[];
  };

  it('lets a member delete their own photo: row, both objects and the listing go', async () => {
    const photo = await add(w.member.cookie);
    expect(await keysOf(photo.id)).toHaveLength(2);
    expect(await listed()).toContain(photo.id);
    await remove(photo.id, w.member.cookie).expect(204);
    expect(await keysOf(photo.id)).toEqual([]);
    expect(await t.db.select().from(photos).where(eq(photos.id, photo.id))).toEqual([]);
    expect(await listed()).not.toContain(photo.id);
    expectError(
      await request(t.app).get(photo.url).set('Cookie', w.owner.cookie),
      404,
      'photo_not_found',
    );
    // Gone is gone: a second delete finds nothing.
    expectError(await remove(photo.id, w.member.cookie), 404, 'photo_not_found');
  });

  it('refuses a member someone else’s photo and a viewer any, and lets the owner', async () => {
    const photo = await add(w.owner.cookie);
    expectError(await remove(photo.id, w.member.cookie), 403, 'not_your_photo');
    expectError(await remove(photo.id, w.viewer.cookie), 403, 'forbidden');
    // Shop B's owner through shop B: not B's photo.
    expectError(
      await request(t.app)
        .delete(`/api/v1/shops/${w.b.id}/photos/${photo.id}`)
        .set('Cookie', w.stranger.cookie),
      404,
      'photo_not_found',
    );
    expect(await keysOf(photo.id)).toHaveLength(2);
    const byMember = await add(w.member.cookie);
    await remove(byMember.id, w.owner.cookie).expect(204);
    await remove(photo.id, w.owner.cookie).expect(204);
    expect(await keysOf(photo.id)).toEqual([]);
    expect(await keysOf(byMember.id)).toEqual([]);
  });

  it('answers 503 while the store is away and keeps the photo, then deletes it once back', async () => {
    const photo = await add(w.member.cookie);
    await s3.stop();
    try {
      const res = await remove(photo.id, w.member.cookie);
      expectError(res, 503, 'storage_unavailable');
    } finally {
      await s3.start();
    }
    // Still listed and still served: nothing half-deleted that a person could see.
    expect(await listed()).toContain(photo.id);
    await request(t.app).get(photo.url).set('Cookie', w.viewer.cookie).expect(200);
    await remove(photo.id, w.member.cookie).expect(204);
    expect(await keysOf(photo.id)).toEqual([]);
  });

  it('answers 404 for an id that is not a UUID', async () => {
    expectError(await remove('not-a-photo', w.owner.cookie), 404, 'photo_not_found');
  });
});
