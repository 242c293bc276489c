// Two shops and the people around them, made straight through db/queries (cheap: one password
// hash shared by everyone) so the tenant matrix can have a fresh world for every route.
import { randomUUID } from 'node:crypto';

import { createInvitation } from '@/db/queries/invitations';
import { addMember } from '@/db/queries/memberships';
import { insertSensor } from '@/db/queries/sensors';
import { createShopWithOwner } from '@/db/queries/shops';
import { insertTest, insertTrial } from '@/db/queries/trials';
import { insertUser } from '@/db/queries/users';
import { insertZone } from '@/db/queries/zones';
import { hashToken, newLinkToken } from '@/server/auth/linkTokens';
import { hashPassword } from '@/server/auth/password';
import { SESSION_COOKIE } from '@/server/auth/session';

import type { TestApp } from './app';

export type Actor = 'anonymous' | 'stranger' | 'viewer' | 'member' | 'owner';
/** Least to most privileged: destructive requests by owners come last. */
export const ACTORS: readonly Actor[] = ['anonymous', 'stranger', 'viewer', 'member', 'owner'];

export const WORLD_PASSWORD = 'matrix password 1';
let sharedHash: Promise<string> | null = null;

async function person(t: TestApp, label: string) {
  sharedHash ??= hashPassword(WORLD_PASSWORD);
  const email = `${label}-${randomUUID().slice(0, 8)}@matrix.example`;
  const user = await insertUser(t.db, {
    email,
    name: `${label} ${email}`,
    passwordHash: await sharedHash,
  });
  if (!user) throw new Error('user insert failed');
  const cookie = `${SESSION_COOKIE}=${await t.sessions.sign(user.id, user.sessionVersion)}`;
  return { ...user, cookie };
}

async function shop(t: TestApp, label: string, ownerId: string) {
  const tag = randomUUID().slice(0, 8);
  const s = await createShopWithOwner(
    t.db,
    { name: `${label} ${tag}`, timeZone: 'Europe/Oslo' },
    ownerId,
  );
  const zone = await insertZone(t.db, s.id, `${label} zone ${tag}`);
  const sensor = await insertSensor(t.db, {
    shopId: s.id,
    zoneId: zone.id,
    name: `${label} sensor ${tag}`,
    tokenHash: hashToken(newLinkToken()),
  });
  const trial = await insertTrial(t.db, s.id, {
    name: `${label} trial ${tag}`,
    createdBy: ownerId,
    treatments: [`${label} wax ${tag}`, `${label} oil ${tag}`],
  });
  const test = await insertTest(t.db, s.id, trial.id, {
    name: `${label} test ${tag}`,
    kind: 'condensation',
    from: new Date('2026-01-05T08:00:00Z'),
    to: new Date('2026-01-06T08:00:00Z'),
    zoneId: zone.id,
    sensorId: null,
    notes: null,
  });
  return { ...s, zone, sensor, trial, test };
}

/** Shop A with an owner, a member and a viewer; shop B owned by the stranger. */
export async function makeWorld(t: TestApp) {
  const owner = await person(t, 'owner');
  const member = await person(t, 'member');
  const viewer = await person(t, 'viewer');
  const stranger = await person(t, 'stranger');
  const a = await shop(t, 'Shop A', owner.id);
  const b = await shop(t, 'Shop B', stranger.id);
  await addMember(t.db, a.id, member.id, 'member');
  await addMember(t.db, a.id, viewer.id, 'viewer');
  const invitationToken = newLinkToken();
  const invitation = await createInvitation(t.db, {
    shopId: a.id,
    email: `invitee-${randomUUID().slice(0, 8)}@matrix.example`,
    role: 'viewer',
    tokenHash: hashToken(invitationToken),
    invitedBy: owner.id,
    expiresAt: new Date(Date.now() + 86_400_000),
  });
  return { owner, member, viewer, stranger, a, b, invitation, invitationToken };
}

export type World = Awaited<ReturnType<typeof makeWorld>>;

/** Strings that belong to shop A only / shop B only: none may reach the other side. */
export function secretsOf(world: World) {
  const { a, b } = world;
  return {
    a: [
      a.id,
      a.name,
      a.zone.id,
      a.zone.name,
      a.sensor.id,
      a.sensor.name,
      a.trial.id,
      a.trial.name,
      ...a.trial.treatments.flatMap((t) => [t.id, t.name]),
      a.test.id,
      a.test.name,
      world.owner.email,
      world.member.email,
      world.viewer.email,
    ],
    b: [
      b.id,
      b.name,
      b.zone.id,
      b.zone.name,
      b.sensor.id,
      b.sensor.name,
      b.trial.id,
      b.trial.name,
      ...b.trial.treatments.flatMap((t) => [t.id, t.name]),
      b.test.id,
      b.test.name,
      world.stranger.email,
    ],
  };
}
