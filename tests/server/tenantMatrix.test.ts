// The tenant matrix, generated from the policy table (server/auth/policy.ts): every API route
// × {owner, member, viewer, a member of another shop, anonymous} → the status the table
// implies, and no response body carrying the other shop's ids, names or people. A route added
// to the table joins the matrix by itself; SAMPLES only make the allowed cases more exact.
import { randomUUID } from 'node:crypto';

import request from 'supertest';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type PgBoss from 'pg-boss';

import { insertCareEntry, insertSurface } from '@/db/queries/surfaces';
import { createImportQueue, importJobs, startJobRunner } from '@/server/jobs';
import { silentLogger } from '@/server/logger';
import { POLICY, ROLE_RANK, isShopRole, type PolicyRow } from '@/server/auth/policy';

import { makeTestApp, type TestApp } from '../support/app';
import { startS3Fake, type S3Fake } from '../support/s3';
import { ACTORS, makeWorld, secretsOf, type Actor, type World } from '../support/tenants';

let t: TestApp;
let s3: S3Fake;
// Started imports queue a real pg-boss job (nobody works it here: the matrix is about who may).
let boss: PgBoss;
beforeAll(async () => {
  s3 = await startS3Fake();
  boss = await startJobRunner({
    databaseUrl: process.env.DATABASE_URL!,
    logger: silentLogger(),
    cron: false,
    schema: 'pgboss_matrix',
  });
  await createImportQueue(boss);
  t = makeTestApp({ storage: s3.config, imports: importJobs(boss) });
});
afterAll(async () => {
  await boss.stop({ graceful: false });
  await t.pool.end();
  await s3.dispose();
});

const key = (row: PolicyRow) => `${row.method} ${row.path}`;
const fresh = () => `${randomUUID().slice(0, 8)}@matrix.example`;

const tinyJpeg = (background: string) =>
  sharp({ create: { width: 8, height: 8, channels: 3, background } })
    .jpeg()
    .toBuffer();

interface Sample {
  body?: (w: World) => object;
  /** Sent as the multipart file field `photo` instead of a JSON body. */
  photo?: () => Promise<Buffer>;
  /** Sent as the multipart file field `file` (a CSV import) instead of a JSON body. */
  file?: () => Buffer;
  /** Status for an actor the policy lets through (`default` for all of them). */
  status?: Partial<Record<Actor | 'default', number>>;
}

// What an allowed caller sends and gets. Actors go from least to most privileged on one fresh
// world per route, so e.g. the viewer and member have left before the last owner tries to.
const SAMPLES: Record<string, Sample> = {
  'GET /health': { status: { default: 200 } },
  'POST /auth/sign-up': {
    body: () => ({ email: fresh(), password: 'long enough pass', name: 'New' }),
    status: { default: 202 },
  },
  // A well-formed token of no link: refused, whoever asks.
  'POST /auth/verify': { body: () => ({ token: 'v'.repeat(43) }), status: { default: 400 } },
  'POST /auth/sign-in': {
    body: () => ({ email: fresh(), password: 'wrong password' }),
    status: { default: 401 },
  },
  'POST /auth/sign-out': { status: { default: 204 } },
  'POST /auth/password-reset': { body: () => ({ email: fresh() }), status: { default: 202 } },
  'POST /auth/password-reset/confirm': {
    body: () => ({ token: 'x'.repeat(43), password: 'long enough pass' }),
    status: { default: 410 },
  },
  'GET /me': { status: { default: 200 } },
  'PATCH /me': { body: () => ({ unitPref: 'F' }), status: { default: 200 } },
  // The matrix's people were never verified, so each may ask for a link.
  'POST /me/verification': { body: () => ({}), status: { default: 202 } },
  'POST /me/password': {
    body: () => ({ currentPassword: 'not it at all', newPassword: 'another long one' }),
    status: { default: 400 },
  },
  'POST /shops': {
    body: () => ({ name: 'Fresh shop', timeZone: 'America/Chicago' }),
    status: { default: 201 },
  },
  'GET /shops/:shopId': { status: { default: 200 } },
  'PATCH /shops/:shopId': { body: () => ({ timeZone: 'Europe/Dublin' }), status: { default: 200 } },
  'DELETE /shops/:shopId': { body: (w) => ({ confirmName: w.a.name }), status: { default: 204 } },
  'GET /shops/:shopId/zones': { status: { default: 200 } },
  'POST /shops/:shopId/zones': { body: () => ({ name: 'Spray booth' }), status: { default: 201 } },
  'PATCH /shops/:shopId/zones/:zoneId': {
    body: () => ({ cautionK: 4, wetK: 1.5 }),
    status: { default: 200 },
  },
  // The world's zone holds a sensor, so the owner's delete is refused as not empty.
  'DELETE /shops/:shopId/zones/:zoneId': { status: { default: 409 } },
  'GET /shops/:shopId/zones/:zoneId/readings': { status: { default: 200 } },
  'GET /shops/:shopId/sensors': { status: { default: 200 } },
  'POST /shops/:shopId/sensors': {
    body: (w) => ({ name: 'New probe', zoneId: w.a.zone.id }),
    status: { default: 201 },
  },
  'PATCH /shops/:shopId/sensors/:sensorId': {
    body: () => ({ name: 'Renamed probe' }),
    status: { default: 200 },
  },
  'DELETE /shops/:shopId/sensors/:sensorId': { status: { default: 204 } },
  'POST /shops/:shopId/sensors/:sensorId/token': { status: { default: 201 } },
  'DELETE /shops/:shopId/sensors/:sensorId/token': { status: { default: 204 } },
  'GET /shops/:shopId/members': { status: { default: 200 } },
  'PATCH /shops/:shopId/members/:userId': {
    body: () => ({ role: 'member' }),
    status: { default: 200 },
  },
  'DELETE /shops/:shopId/members/:userId': { status: { default: 204 } },
  // The viewer and the member leave; the owner, then the last owner, may not.
  'DELETE /shops/:shopId/membership': { status: { default: 204, owner: 409 } },
  'GET /shops/:shopId/invitations': { status: { default: 200 } },
  'POST /shops/:shopId/invitations': {
    body: () => ({ email: fresh(), role: 'viewer' }),
    status: { default: 201 },
  },
  'DELETE /shops/:shopId/invitations/:invitationId': { status: { default: 204 } },
  'GET /invitations/:token': { status: { default: 200 } },
  // The anonymous caller accepts first with a new account; then the link is spent.
  'POST /invitations/:token/accept': {
    body: () => ({ name: 'Invitee', password: 'long enough pass' }),
    status: { default: 404, anonymous: 201 },
  },
  'POST /shops/:shopId/alarms/:alarmId/ack': { body: () => ({ note: 'Wiped and covered' }) },
  // The last complete week, as JSON, for everyone in the shop.
  'GET /shops/:shopId/reports/week': { status: { default: 200 } },
  'GET /shops/:shopId/trials': { status: { default: 200 } },
  'POST /shops/:shopId/trials': {
    body: () => ({ name: 'Wax or oil', treatments: ['Paste wax', 'Camellia oil'] }),
    status: { default: 201 },
  },
  'GET /shops/:shopId/trials/:trialId': { status: { default: 200 } },
  'POST /shops/:shopId/trials/:trialId/tests': {
    body: () => ({
      name: 'Cold morning',
      kind: 'condensation',
      from: '2026-01-12T06:00:00Z',
      to: '2026-01-12T10:00:00Z',
    }),
    status: { default: 201 },
  },
  'PUT /shops/:shopId/trials/:trialId/tests/:testId/ranks': {
    body: (w) => ({
      ranks: w.a.trial.treatments.map((t, i) => ({ treatmentId: t.id, rank: i + 1 })),
    }),
    status: { default: 200 },
  },
  'GET /shops/:shopId/surfaces': { status: { default: 200 } },
  'POST /shops/:shopId/surfaces': {
    body: (w) => ({ name: 'Jointer bed', zoneId: w.a.zone.id }),
    status: { default: 201 },
  },
  'GET /shops/:shopId/surfaces/:surfaceId': { status: { default: 200 } },
  'POST /shops/:shopId/surfaces/:surfaceId/care': {
    body: () => ({ kind: 'inspection', at: new Date().toISOString(), rusting: 1 }),
    status: { default: 201 },
  },
  'GET /shops/:shopId/surfaces/:surfaceId/exposure': { status: { default: 200 } },
  'GET /shops/:shopId/coating-budgets': { status: { default: 200 } },
  'PUT /shops/:shopId/coating-budgets': {
    body: () => ({ budgets: [{ coating: 'wax', hoursWet: 3, hoursClose: 50, towHours: 400 }] }),
    status: { default: 200 },
  },
  'POST /shops/:shopId/photos': { photo: () => tinyJpeg('#808080'), status: { default: 201 } },
  'POST /shops/:shopId/surfaces/:surfaceId/care/:entryId/photos': {
    photo: () => tinyJpeg('#406080'),
    status: { default: 201 },
  },
  'POST /shops/:shopId/trials/:trialId/tests/:testId/photos': {
    photo: () => tinyJpeg('#604080'),
    status: { default: 201 },
  },
  // Shop A's photo, stored by its owner before the actors ask.
  'GET /shops/:shopId/photos/:photoId': { status: { default: 200 } },
  // The owner added it: the member may not delete it, the owner may.
  'DELETE /shops/:shopId/photos/:photoId': { status: { member: 403, owner: 204 } },
  'GET /shops/:shopId/photos/:photoId/thumb': { status: { default: 200 } },
  'GET /shops/:shopId/sensors/:sensorId/imports': { status: { default: 200 } },
  'POST /shops/:shopId/sensors/:sensorId/imports': {
    file: () => Buffer.from(MATRIX_CSV),
    status: { default: 201 },
  },
  // Shop A's import, uploaded by its owner before the actors ask.
  'GET /shops/:shopId/sensors/:sensorId/imports/:importId': { status: { default: 200 } },
  // The member starts it; then it is no longer waiting to be started.
  'POST /shops/:shopId/sensors/:sensorId/imports/:importId/start': {
    body: () => ({ mapping: MATRIX_MAPPING, remember: false }),
    status: { member: 202, owner: 409 },
  },
  // Cancelling a cancelled import answers it as it is.
  'POST /shops/:shopId/sensors/:sensorId/imports/:importId/cancel': { status: { default: 200 } },
  'GET /shops/:shopId/sensors/:sensorId/imports/:importId/rejected.csv': {
    status: { default: 200 },
  },
};

const MATRIX_CSV = 'time,air,rh\n2025-06-01T00:00:00Z,14.2,71\n';
const MATRIX_MAPPING = {
  timeColumn: 'time',
  airColumn: 'air',
  rhColumn: 'rh',
  surfaceColumn: null,
  temperatureUnit: 'C',
  timeFormat: 'iso',
  timeZone: 'UTC',
};

/** An import of shop A's sensor (the file in the S3 fake) when the route names one. */
async function importFor(row: PolicyRow, w: World): Promise<string | undefined> {
  if (!row.path.includes(':importId')) return undefined;
  const res = await request(t.app)
    .post(`/api/v1/shops/${w.a.id}/sensors/${w.a.sensor.id}/imports`)
    .set('Cookie', w.owner.cookie)
    .attach('file', Buffer.from(MATRIX_CSV), 'matrix.csv')
    .expect(201);
  return res.body.import.id as string;
}

/**
 * A surface of shop A, with an inspection logged on it, for the routes that name one (the world
 * itself has none).
 */
async function surfaceFor(
  row: PolicyRow,
  w: World,
): Promise<{ surfaceId?: string; entryId?: string }> {
  if (!row.path.includes(':surfaceId')) return {};
  const surface = await insertSurface(t.db, {
    shopId: w.a.id,
    zoneId: w.a.zone.id,
    name: `Saw top ${randomUUID().slice(0, 8)}`,
    material: 'cast iron',
    sensorId: null,
  });
  const entry = await insertCareEntry(t.db, {
    shopId: w.a.id,
    surfaceId: surface.id,
    kind: 'inspection',
    at: new Date('2026-01-05T09:00:00Z'),
    byUserId: w.owner.id,
    coatingType: null,
    product: null,
    rusting: 1,
    note: null,
  });
  return { surfaceId: surface.id, entryId: entry.id };
}

/** A real photo in shop A (objects in the S3 fake) when the route names one, else no id. */
async function photoFor(row: PolicyRow, w: World): Promise<string | undefined> {
  if (!row.path.includes(':photoId')) return undefined;
  const jpeg = await sharp({
    create: { width: 16, height: 16, channels: 3, background: '#806040' },
  })
    .jpeg()
    .toBuffer();
  const res = await request(t.app)
    .post(`/api/v1/shops/${w.a.id}/photos`)
    .set('Cookie', w.owner.cookie)
    .attach('photo', jpeg, 'matrix.jpg')
    .expect(201);
  return res.body.id as string;
}

/** The path with the world's ids; the target of /members/:userId is the viewer. */
function pathFor(
  row: PolicyRow,
  w: World,
  shop: World['a'] | World['b'] = w.a,
  ids: { surfaceId?: string; entryId?: string; photoId?: string; importId?: string } = {},
): string {
  const values: Record<string, string | undefined> = {
    ...ids,
    shopId: shop.id,
    zoneId: w.a.zone.id,
    sensorId: w.a.sensor.id,
    userId: w.viewer.id,
    invitationId: w.invitation.id,
    token: w.invitationToken,
    alarmId: randomUUID(),
    trialId: w.a.trial.id,
    testId: w.a.test.id,
  };
  return row.path.replace(/:(\w+)/g, (_m, name: string) => {
    const value = values[name];
    if (!value) throw new Error(`no value for :${name} in ${row.path}; add it to pathFor`);
    return value;
  });
}

function cookieOf(w: World, actor: Actor): string | null {
  return actor === 'anonymous' ? null : w[actor].cookie;
}

async function call(
  row: PolicyRow,
  path: string,
  cookie: string | null,
  body?: object,
  photo?: Buffer,
  file?: Buffer,
) {
  const method = row.method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete';
  let req = request(t.app)[method](`/api/v1${path}`);
  if (cookie) req = req.set('Cookie', cookie);
  if (photo) return req.attach('photo', photo, 'matrix.jpg');
  if (file) return req.attach('file', file, 'matrix.csv');
  return body ? req.send(body) : req;
}

type Outcome = { status: number; code?: string };

/** What the table says for this actor: a refusal, or null when the policy lets them through. */
function refusal(row: PolicyRow, actor: Actor): Outcome | null {
  if (row.access === 'anyone') return null;
  if (row.access === 'sensor') return { status: 401, code: 'missing_token' };
  if (actor === 'anonymous') return { status: 401, code: 'not_signed_in' };
  if (row.access === 'user') return null;
  if (actor === 'stranger') return { status: 404, code: 'shop_not_found' };
  if (isShopRole(row.access) && ROLE_RANK[actor] < ROLE_RANK[row.access]) {
    return { status: 403, code: 'forbidden' };
  }
  return null;
}

const POLICY_REFUSALS = new Set(['not_signed_in', 'forbidden', 'shop_not_found']);

describe('tenant matrix (generated from server/auth/policy.ts)', () => {
  it('has a sample value for every path parameter in the table', () => {
    const params = new Set(
      POLICY.flatMap((row) => [...row.path.matchAll(/:(\w+)/g)].map((m) => m[1])),
    );
    expect([...params].sort()).toEqual(
      [
        'alarmId',
        'entryId',
        'importId',
        'invitationId',
        'photoId',
        'sensorId',
        'shopId',
        'surfaceId',
        'testId',
        'token',
        'trialId',
        'userId',
        'zoneId',
      ].sort(),
    );
  });

  // The table is the rule, so the matrix cannot catch a wrong row; this pins the one decision
  // a slip would cost most: changing a shop's setup is for owners (DESIGN.md's roles). A new
  // write route for members or viewers must be added here on purpose.
  it('keeps every write under /shops/:shopId for owners, except the listed ones', () => {
    const belowOwner = POLICY.filter(
      (row) =>
        row.method !== 'GET' && row.path.startsWith('/shops/:shopId') && row.access !== 'owner',
    ).map(key);
    expect(belowOwner.sort()).toEqual(
      [
        'DELETE /shops/:shopId/membership',
        'POST /shops/:shopId/alarms/:alarmId/ack',
        // Trials are work done in the shop: members add and rank tests (API.md).
        'POST /shops/:shopId/trials',
        'POST /shops/:shopId/trials/:trialId/tests',
        'PUT /shops/:shopId/trials/:trialId/tests/:testId/ranks',
        // Coating and inspecting the iron is shop work (API.md: owners and members write).
        'POST /shops/:shopId/surfaces',
        'POST /shops/:shopId/surfaces/:surfaceId/care',
        'PUT /shops/:shopId/coating-budgets',
        // Photos of care and trials are taken by whoever does the work, and a member removes
        // the ones they added (the route refuses anyone else's).
        'POST /shops/:shopId/photos',
        'POST /shops/:shopId/surfaces/:surfaceId/care/:entryId/photos',
        'POST /shops/:shopId/trials/:trialId/tests/:testId/photos',
        'DELETE /shops/:shopId/photos/:photoId',
        // Bringing in a logger's history is shop work too (the imports contract).
        'POST /shops/:shopId/sensors/:sensorId/imports',
        'POST /shops/:shopId/sensors/:sensorId/imports/:importId/start',
        'POST /shops/:shopId/sensors/:sensorId/imports/:importId/cancel',
      ].sort(),
    );
  });

  it.each(POLICY.map((row) => [key(row), row] as const))('%s', async (_name, row) => {
    const w = await makeWorld(t);
    const secrets = secretsOf(w);
    const sample = SAMPLES[key(row)] ?? {};
    const ids = {
      ...(await surfaceFor(row, w)),
      photoId: await photoFor(row, w),
      importId: await importFor(row, w),
    };
    const photo = await sample.photo?.();
    for (const actor of ACTORS) {
      const res = await call(
        row,
        pathFor(row, w, w.a, ids),
        cookieOf(w, actor),
        sample.body?.(w),
        photo,
        sample.file?.(),
      );
      const where = `${key(row)} as ${actor}: ${res.status} ${(res.text ?? '').slice(0, 200)}`;
      expect(res.status, where).not.toBe(500);
      const refused = refusal(row, actor);
      if (refused) {
        expect({ status: res.status, code: res.body?.error?.code }, where).toEqual(refused);
      } else {
        expect(POLICY_REFUSALS.has(res.body?.error?.code), where).toBe(false);
        const wanted = sample.status?.[actor] ?? sample.status?.default;
        if (wanted !== undefined) expect(res.status, where).toBe(wanted);
      }
      // Leaks: nobody outside shop A sees its data (the invitation link's holder excepted:
      // the token is the key), and nobody but the stranger sees shop B's.
      // Photos answer bytes, not text: nothing of either shop's to find in them.
      const text = res.text ?? '';
      const outsideA = actor === 'anonymous' || actor === 'stranger';
      if (outsideA && !row.path.includes(':token')) {
        for (const secret of secrets.a) expect(text, where).not.toContain(secret);
      }
      if (actor !== 'stranger') {
        for (const secret of secrets.b) expect(text, where).not.toContain(secret);
      }
    }
  });

  // Shop B's owner naming shop B in the path but one of shop A's zones, sensors, members,
  // invitations or photos: the resource is not in their shop, so it does not exist for them.
  const nested = POLICY.filter(
    (row) =>
      isShopRole(row.access) &&
      /:(zoneId|sensorId|userId|invitationId|trialId|testId|surfaceId|entryId|photoId)/.test(
        row.path,
      ),
  );
  it.each(nested.map((row) => [key(row), row] as const))(
    "%s with another shop's id answers 404 and changes nothing",
    async (_name, row) => {
      const w = await makeWorld(t);
      const sample = SAMPLES[key(row)] ?? {};
      const ids = {
        ...(await surfaceFor(row, w)),
        photoId: await photoFor(row, w),
        importId: await importFor(row, w),
      };
      const res = await call(
        row,
        pathFor(row, w, w.b, ids),
        w.stranger.cookie,
        sample.body?.(w),
        await sample.photo?.(),
        sample.file?.(),
      );
      expect(res.status, res.text).toBe(404);
      for (const secret of secretsOf(w).a) expect(res.text).not.toContain(secret);
      const zones = await request(t.app)
        .get(`/api/v1/shops/${w.a.id}/zones`)
        .set('Cookie', w.owner.cookie)
        .expect(200);
      expect(zones.body.zones).toEqual([
        expect.objectContaining({ id: w.a.zone.id, name: w.a.zone.name, cautionK: 3, wetK: 1 }),
      ]);
      const members = await request(t.app)
        .get(`/api/v1/shops/${w.a.id}/members`)
        .set('Cookie', w.owner.cookie)
        .expect(200);
      expect(members.body.members).toHaveLength(3);
    },
  );
});
