// Photos end to end: real HTTP through the app, a real S3 API (s3rver on loopback), the real
// database. Test images are made here with sharp; none is fetched from anywhere.
import { count, eq } from 'drizzle-orm';
import request from 'supertest';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { photos } from '@/db/schema';
import { readConfig } from '@/server/config';
import { PHOTO_MAX_BYTES } from '@/server/photos';
import { createS3Storage, StorageUnavailableError } from '@/server/storage';

import { makeTestApp, type TestApp } from '../support/app';
import { binaryBody } from '../support/binary';
import { errorShape } from '../support/errorShape';
import { exifTags, GPS_LATITUDE } from '../support/exif';
import { startS3Fake, type S3Fake } from '../support/s3';
import { makeWorld, type World } from '../support/tenants';

let s3: S3Fake;
let t: TestApp;
let w: World;

beforeAll(async () => {
  s3 = await startS3Fake();
  t = makeTestApp({ storage: s3.config });
  w = await makeWorld(t);
});
afterAll(async () => {
  await t.pool.end();
  await s3.dispose();
});

const solid = (widthPx: number, heightPx: number) =>
  sharp({ create: { width: widthPx, height: heightPx, channels: 3, background: '#7a4f2a' } });

/** A camera-like JPEG with a position: 44°30'N 93°15'W (made up, near no real shop). */
async function jpegWithGps(widthPx: number, heightPx: number): Promise<Buffer> {
  return solid(widthPx, heightPx)
    .jpeg()
    .withExif({
      IFD0: { Make: 'Tamarack test camera' },
      IFD3: {
        GPSLatitudeRef: 'N',
        GPSLatitude: '44/1 30/1 0/1',
        GPSLongitudeRef: 'W',
        GPSLongitude: '93/1 15/1 0/1',
      },
    })
    .toBuffer();
}

const upload = (buf: Buffer, filename: string, cookie = w.member.cookie, shopId = w.a.id) =>
  request(t.app)
    .post(`/api/v1/shops/${shopId}/photos`)
    .set('Cookie', cookie)
    .attach('photo', buf, { filename, contentType: 'image/jpeg' });

/** Reads a binary answer whole (supertest only buffers text types by itself). */
const getBytes = (path: string, cookie: string) =>
  request(t.app).get(path).set('Cookie', cookie).buffer(true).parse(binaryBody);

function expectErrorShape(res: request.Response, status: number, code: string) {
  expect({ status: res.status, code: res.body?.error?.code }, res.text.slice(0, 300)).toEqual({
    status,
    code,
  });
  expect(res.body).toMatchObject(errorShape);
}

async function photoRows(shopId: string): Promise<number> {
  const [row] = await t.db.select({ n: count() }).from(photos).where(eq(photos.shopId, shopId));
  return row!.n;
}

describe('photo upload and the checked proxy', () => {
  it('stores a GPS-tagged JPEG without its EXIF, capped at 2048 px, with a 320 px thumbnail', async () => {
    const original = await jpegWithGps(3000, 2000);
    // The test image really carries a position before upload (EXIF 2.3 GPS IFD, GPSLatitude).
    const before = await sharp(original).metadata();
    expect(exifTags(before.exif!).gps).toContain(GPS_LATITUDE);

    const res = await upload(original, 'saw-top.jpg').expect(201);
    const id = res.body.id as string;
    expect(res.body).toEqual({
      id,
      url: `/api/v1/shops/${w.a.id}/photos/${id}`,
      thumbUrl: `/api/v1/shops/${w.a.id}/photos/${id}/thumb`,
      // fit inside 2048: 3000×2000 × 2048/3000 = 2048 × 1365.33 → 1365 (sharp rounds).
      widthPx: 2048,
      heightPx: 1365,
      addedById: w.member.id,
    });

    // Read back through the route, as the viewer (everyone in the shop sees photos).
    const full = await getBytes(res.body.url, w.viewer.cookie).expect(200);
    expect(full.headers['content-type']).toBe('image/jpeg');
    expect(full.headers['cache-control']).toMatch(/^private\b/);
    const meta = await sharp(full.body as Buffer).metadata();
    expect(meta.format).toBe('jpeg');
    expect([meta.width, meta.height]).toEqual([2048, 1365]);
    expect(meta.exif).toBeUndefined();

    const thumb = await getBytes(res.body.thumbUrl, w.viewer.cookie).expect(200);
    const thumbMeta = await sharp(thumb.body as Buffer).metadata();
    // 3000×2000 × 320/3000 = 320 × 213.33 → 213.
    expect([thumbMeta.width, thumbMeta.height]).toEqual([320, 213]);
    expect(thumbMeta.exif).toBeUndefined();
    expect(thumb.headers['cache-control']).toMatch(/^private\b/);

    // The keys carry the shop; the row records both sizes.
    expect(await s3.keys(`shops/${w.a.id}/photos/${id}`)).toEqual([
      `shops/${w.a.id}/photos/${id}-thumb.jpg`,
      `shops/${w.a.id}/photos/${id}.jpg`,
    ]);
    const [row] = await t.db.select().from(photos).where(eq(photos.id, id));
    expect(row).toMatchObject({
      shopId: w.a.id,
      createdBy: w.member.id,
      widthPx: 2048,
      heightPx: 1365,
      thumbWidthPx: 320,
      thumbHeightPx: 213,
      bytes: (full.body as Buffer).length,
      thumbBytes: (thumb.body as Buffer).length,
    });
  });

  it('turns the pixels by the EXIF orientation before dropping it', async () => {
    // Orientation 6 (EXIF 2.3 §4.6.4 A): the camera was turned 90° clockwise; shown upright,
    // a 300×200 frame is 200 wide and 300 high.
    const turned = await solid(300, 200).jpeg().withMetadata({ orientation: 6 }).toBuffer();
    const res = await upload(turned, 'turned.jpg').expect(201);
    expect([res.body.widthPx, res.body.heightPx]).toEqual([200, 300]);
    const back = await getBytes(res.body.url, w.owner.cookie).expect(200);
    const meta = await sharp(back.body as Buffer).metadata();
    expect([meta.width, meta.height, meta.orientation]).toEqual([200, 300, undefined]);
  });

  it('keeps a small PNG at its size and stores it as JPEG', async () => {
    const png = await solid(120, 80).png().toBuffer();
    const res = await upload(png, 'bench.png').expect(201);
    expect([res.body.widthPx, res.body.heightPx]).toEqual([120, 80]);
    const back = await getBytes(res.body.thumbUrl, w.member.cookie).expect(200);
    // Smaller than the thumbnail's 320 px: never enlarged.
    const meta = await sharp(back.body as Buffer).metadata();
    expect([meta.format, meta.width, meta.height]).toEqual(['jpeg', 120, 80]);
  });

  it('answers 404 for another shop’s photo, whoever asks and by either URL', async () => {
    const res = await upload(await solid(64, 64).jpeg().toBuffer(), 'a.jpg').expect(201);
    const id = res.body.id as string;
    // The stranger, through their own shop B: the id is not B's.
    const viaB = await request(t.app)
      .get(`/api/v1/shops/${w.b.id}/photos/${id}`)
      .set('Cookie', w.stranger.cookie);
    expectErrorShape(viaB, 404, 'photo_not_found');
    const thumbViaB = await request(t.app)
      .get(`/api/v1/shops/${w.b.id}/photos/${id}/thumb`)
      .set('Cookie', w.stranger.cookie);
    expectErrorShape(thumbViaB, 404, 'photo_not_found');
    // The stranger on shop A's own URL: not a member, so the shop itself is not found.
    const viaA = await request(t.app).get(res.body.url).set('Cookie', w.stranger.cookie);
    expectErrorShape(viaA, 404, 'shop_not_found');
    // Nobody signed in: no bytes.
    const anonymous = await request(t.app).get(res.body.url);
    expectErrorShape(anonymous, 401, 'not_signed_in');
  });

  it('answers 503 when storage is away, and leaves no row and no object', async () => {
    const rowsBefore = await photoRows(w.a.id);
    const keysBefore = await s3.keys(`shops/${w.a.id}/`);
    await s3.stop();
    try {
      const res = await upload(await jpegWithGps(400, 300), 'while-down.jpg');
      expectErrorShape(res, 503, 'storage_unavailable');
      expect(res.headers['retry-after']).toBe('30');
    } finally {
      await s3.start();
    }
    expect(await photoRows(w.a.id)).toBe(rowsBefore);
    expect(await s3.keys(`shops/${w.a.id}/`)).toEqual(keysBefore);
  });
});

describe('deleting a shop', () => {
  it('removes its photos from the bucket, and leaves other shops’ alone', async () => {
    const world = await makeWorld(t);
    const jpeg = await solid(50, 40).jpeg().toBuffer();
    for (const name of ['one.jpg', 'two.jpg']) {
      await request(t.app)
        .post(`/api/v1/shops/${world.a.id}/photos`)
        .set('Cookie', world.member.cookie)
        .attach('photo', jpeg, name)
        .expect(201);
    }
    const kept = await request(t.app)
      .post(`/api/v1/shops/${world.b.id}/photos`)
      .set('Cookie', world.stranger.cookie)
      .attach('photo', jpeg, 'b.jpg')
      .expect(201);
    // Two photos, each with its thumbnail.
    expect(await s3.keys(`shops/${world.a.id}/`)).toHaveLength(4);

    await request(t.app)
      .delete(`/api/v1/shops/${world.a.id}`)
      .set('Cookie', world.owner.cookie)
      .send({ confirmName: world.a.name })
      .expect(204);
    expect(await s3.keys(`shops/${world.a.id}/`)).toEqual([]);
    expect(await photoRows(world.a.id)).toBe(0);
    expect(await s3.keys(`shops/${world.b.id}/`)).toHaveLength(2);
    await getBytes(kept.body.url, world.stranger.cookie).expect(200);
  });
});

describe('reading a photo when the store cannot give it', () => {
  it('answers 503 while the store is away and the photo again once it is back', async () => {
    const res = await upload(await solid(90, 60).jpeg().toBuffer(), 'read.jpg').expect(201);
    await s3.stop();
    try {
      const away = await request(t.app).get(res.body.url).set('Cookie', w.viewer.cookie);
      expectErrorShape(away, 503, 'storage_unavailable');
    } finally {
      await s3.start();
    }
    const back = await getBytes(res.body.url, w.viewer.cookie).expect(200);
    const meta = await sharp(back.body as Buffer).metadata();
    expect([meta.width, meta.height]).toEqual([90, 60]);
  });

  it('answers 503, not 404, when a recorded object is missing from the bucket', async () => {
    const res = await upload(await solid(90, 60).jpeg().toBuffer(), 'lost.jpg').expect(201);
    // Lost behind the app's back (an operator's mistake, a lifecycle rule): the row says it
    // was stored, so the answer blames the store.
    await createS3Storage(s3.config).delete(`shops/${w.a.id}/photos/${res.body.id}-thumb.jpg`);
    const thumb = await request(t.app).get(res.body.thumbUrl).set('Cookie', w.viewer.cookie);
    expectErrorShape(thumb, 503, 'storage_unavailable');
    await getBytes(res.body.url, w.viewer.cookie).expect(200);
  });
});

describe('a store that fails half-way', () => {
  it('deletes the photo it put when the thumbnail cannot be stored, and writes no row', async () => {
    // The real store, with its second put refused as an unreachable store refuses it.
    let puts = 0;
    const faulty = makeTestApp({
      storage: s3.config,
      wrapStorage: (real) => ({
        ...real,
        async put(key, body, contentType) {
          puts += 1;
          if (puts === 2) throw new StorageUnavailableError(new Error('injected: thumbnail put'));
          return real.put(key, body, contentType);
        },
      }),
    });
    try {
      const world = await makeWorld(faulty);
      const jpeg = await solid(500, 400).jpeg().toBuffer();
      const res = await request(faulty.app)
        .post(`/api/v1/shops/${world.a.id}/photos`)
        .set('Cookie', world.member.cookie)
        .attach('photo', jpeg, 'half.jpg');
      expectErrorShape(res, 503, 'storage_unavailable');
      // The first put did land before the fault; the clean-up took it away again.
      expect(puts).toBe(2);
      expect(await s3.keys(`shops/${world.a.id}/`)).toEqual([]);
      expect(await photoRows(world.a.id)).toBe(0);
    } finally {
      await faulty.pool.end();
    }
  });
});

describe('storage settings', () => {
  const base = { DATABASE_URL: 'postgres://x@127.0.0.1/db', SESSION_SECRET: 's'.repeat(32) };

  it('reads S3_* into the storage config, path-style endpoint and default region', () => {
    const config = readConfig({
      ...base,
      S3_ENDPOINT: 'https://objects.example.net',
      S3_BUCKET: 'shop-photos',
      S3_ACCESS_KEY_ID: 'AKIDEXAMPLE',
      S3_SECRET_ACCESS_KEY: 'secret',
    });
    expect(config.storage).toEqual({
      endpoint: 'https://objects.example.net',
      bucket: 'shop-photos',
      accessKeyId: 'AKIDEXAMPLE',
      secretAccessKey: 'secret',
      region: 'us-east-1',
    });
    expect(readConfig(base).storage).toBeUndefined();
  });

  it('refuses a bucket without keys and an endpoint that is not http(s)', () => {
    expect(() => readConfig({ ...base, S3_BUCKET: 'shop-photos' })).toThrow(
      /S3_BUCKET needs S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY/,
    );
    expect(() =>
      readConfig({
        ...base,
        S3_ENDPOINT: 'ftp://objects.example.net',
        S3_BUCKET: 'b-1',
        S3_ACCESS_KEY_ID: 'a',
        S3_SECRET_ACCESS_KEY: 'b',
      }),
    ).toThrow(/S3_ENDPOINT must be an http\(s\) URL/);
  });
});

describe('photo bad-input corpus', () => {
  const text = Buffer.from('Planed the bench top, waxed it. Not an image at all.\n');

  // [what is sent, its bytes, the file name it claims]: each is refused with 415, no row.
  it.each([
    // The name and the declared type say JPEG; the bytes (file-type's magic numbers) do not.
    ['a text file named x.jpg', () => Promise.resolve(text), 'x.jpg'],
    [
      'a GIF (a real image of a type we do not take)',
      () => solid(20, 20).gif().toBuffer(),
      'x.gif',
    ],
    // JPEG's start-of-image marker then nothing decodable: sniffed as JPEG, refused by sharp.
    [
      'a JPEG cut after its header',
      async () => (await solid(200, 200).jpeg().toBuffer()).subarray(0, 40),
      'cut.jpg',
    ],
    // An ISO-BMFF header with the 'heic' brand (ISO/IEC 23008-12 annex B), no image after it:
    // refused whether or not this sharp build reads HEIC.
    [
      'a HEIC header with nothing behind it',
      () => Promise.resolve(Buffer.from('\0\0\0\x18ftypheic\0\0\0\0mif1heic', 'latin1')),
      'x.heic',
    ],
    ['an empty file', () => Promise.resolve(Buffer.alloc(0)), 'empty.jpg'],
  ] as const)('%s → 415 unsupported_media_type', async (_name, make, filename) => {
    const rowsBefore = await photoRows(w.a.id);
    const res = await upload(await make(), filename);
    expectErrorShape(res, 415, 'unsupported_media_type');
    expect(await photoRows(w.a.id)).toBe(rowsBefore);
  });

  it('refuses a small file that would unpack to more than 50 Mpx', async () => {
    // 8000 × 7000 = 56 Mpx of one colour: a PNG of ~180 kB that would take 168 MB to decode.
    const bomb = await solid(8000, 7000).png({ compressionLevel: 9 }).toBuffer();
    expect(bomb.length).toBeLessThan(1024 * 1024);
    const res = await upload(bomb, 'flat.png');
    expectErrorShape(res, 415, 'unsupported_media_type');
  });

  it('takes several uploads at once, each whole and distinct', async () => {
    const sizes = [
      [640, 480],
      [480, 640],
      [300, 300],
      [1000, 250],
    ] as const;
    const answers = await Promise.all(
      sizes.map(async ([wPx, hPx]) => upload(await solid(wPx, hPx).jpeg().toBuffer(), 'many.jpg')),
    );
    expect(answers.map((r) => r.status)).toEqual([201, 201, 201, 201]);
    expect(answers.map((r) => [r.body.widthPx, r.body.heightPx])).toEqual(sizes);
    expect(new Set(answers.map((r) => r.body.id)).size).toBe(4);
  });

  it('refuses a file over 10 MiB with 413 photo_too_large', async () => {
    // A JPEG start-of-image marker padded past the limit by one byte.
    const big = Buffer.alloc(PHOTO_MAX_BYTES + 1, 0x20);
    big.set([0xff, 0xd8, 0xff, 0xe0], 0);
    const res = await upload(big, 'huge.jpg');
    expectErrorShape(res, 413, 'photo_too_large');
  });

  it('asks for the photo field when none is sent (JSON, empty form, wrong field name)', async () => {
    const url = `/api/v1/shops/${w.a.id}/photos`;
    const json = await request(t.app).post(url).set('Cookie', w.member.cookie).send({ photo: 'x' });
    expectErrorShape(json, 400, 'invalid_input');
    const empty = await request(t.app)
      .post(url)
      .set('Cookie', w.member.cookie)
      .field('subjectKind', 'care_entry');
    expectErrorShape(empty, 400, 'invalid_input');
    const wrongField = await request(t.app)
      .post(url)
      .set('Cookie', w.member.cookie)
      .attach('image', text, 'x.jpg');
    expectErrorShape(wrongField, 400, 'invalid_input');
  });

  it('refuses two photos in one request', async () => {
    const jpeg = await solid(10, 10).jpeg().toBuffer();
    const res = await request(t.app)
      .post(`/api/v1/shops/${w.a.id}/photos`)
      .set('Cookie', w.member.cookie)
      .attach('photo', jpeg, 'a.jpg')
      .attach('photo', jpeg, 'b.jpg');
    expectErrorShape(res, 400, 'invalid_input');
  });

  it('checks the subject fields: kind from the list, a UUID id, both or neither', async () => {
    const jpeg = await solid(10, 10).jpeg().toBuffer();
    const send = (fields: Record<string, string>) => {
      let req = request(t.app)
        .post(`/api/v1/shops/${w.a.id}/photos`)
        .set('Cookie', w.member.cookie);
      for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
      return req.attach('photo', jpeg, 'a.jpg');
    };
    const id = '3f1c2b9e-8d7a-4c6b-9e5f-1a2b3c4d5e6f';
    expectErrorShape(await send({ subjectKind: 'care_entry' }), 400, 'invalid_input');
    expectErrorShape(await send({ subjectKind: 'invoice', subjectId: id }), 400, 'invalid_input');
    expectErrorShape(
      await send({ subjectKind: 'trial_test', subjectId: 'nope' }),
      400,
      'invalid_input',
    );
    expectErrorShape(await send({ colour: 'red' }), 400, 'invalid_input');
    // A well-formed id of no test of this shop: refused before anything is stored.
    expectErrorShape(
      await send({ subjectKind: 'trial_test', subjectId: id }),
      404,
      'trial_test_not_found',
    );
    const ok = await send({ subjectKind: 'trial_test', subjectId: w.a.test.id }).expect(201);
    const [row] = await t.db.select().from(photos).where(eq(photos.id, ok.body.id));
    expect([row!.ownerKind, row!.ownerId]).toEqual(['trial_test', w.a.test.id]);
  });

  it('refuses a cut-off multipart body with 400', async () => {
    const res = await request(t.app)
      .post(`/api/v1/shops/${w.a.id}/photos`)
      .set('Cookie', w.member.cookie)
      .set('Content-Type', 'multipart/form-data; boundary=XYZ')
      .send(
        '--XYZ\r\nContent-Disposition: form-data; name="photo"; filename="a.jpg"\r\n\r\n\xff\xd8',
      );
    expectErrorShape(res, 400, 'invalid_multipart');
  });

  it('answers 404 for a photo id that is not a UUID or names nothing', async () => {
    for (const id of ['not-a-uuid', '3f1c2b9e-8d7a-4c6b-9e5f-1a2b3c4d5e6f']) {
      const res = await request(t.app)
        .get(`/api/v1/shops/${w.a.id}/photos/${id}`)
        .set('Cookie', w.viewer.cookie);
      expectErrorShape(res, 404, 'photo_not_found');
    }
  });
});
