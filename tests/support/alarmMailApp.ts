// Helpers for the alarm mail tests: a test app whose engine queues real pg-boss jobs, a shop
// with people of every role and preference, and the mail job run by hand with a chosen clock.
import type PgBoss from 'pg-boss';

import { addMember } from '@/db/queries/memberships';
import { insertUser } from '@/db/queries/users';
import { deliverAlarmMail } from '@/server/alarms';
import { createAlarmMailQueue, queueAlarmMails, startJobRunner } from '@/server/jobs';
import { silentLogger } from '@/server/logger';
import { VERIFICATION_SUBJECT, type StoredMail } from '@/server/mail';

import { MINUTE_MS, onlyAlarm, postEach, withMargin } from './alarms';
import {
  makeTestApp,
  ownerWithSensor,
  TEST_PUBLIC_URL,
  uniqueEmail,
  verifiedPerson,
  type TestApp,
} from './app';
import { captureLogs } from './logs';

// Not the demo shop's name: the browser tests find the demo shop by its name in the same database.
export const SHOP_NAME = 'Birch Lane Woodshop';
export const SHOP_TIME_ZONE = 'America/Chicago';

/**
 * pg-boss without cron, its mail queue, and an app whose engine queues a job per opened alarm.
 * Each test file names its own pg-boss schema: a worker in one file must not take the jobs
 * another file runs by hand with its own clock.
 */
export async function startMailTestApp(schema: string) {
  const boss: PgBoss = await startJobRunner({
    databaseUrl: process.env.DATABASE_URL!,
    logger: silentLogger(),
    cron: false,
    schema,
  });
  await createAlarmMailQueue(boss);
  const queueLogs = captureLogs();
  const t = makeTestApp({
    // Series post one request per reading, faster than a real sensor's limit.
    sensorRate: { ratePerS: 1000, burst: 1000 },
    // Retries in a second here, so the outage test does not wait for the real backoff.
    onAlarmsOpened: queueAlarmMails(boss, {
      logger: queueLogs.logger,
      retry: { retryDelay: 1, retryBackoff: false, retryLimit: 30 },
    }),
  });
  return { boss, t, queueLogs };
}

/**
 * A shop (renamed, in Chicago time) with its owner and a sensor, a member in °C, a member in °F,
 * a member who turned alarm mail off and a viewer — the last two set through the API — and a
 * member who never verified the address.
 */
export async function shopWithPeople(t: TestApp) {
  const owner = await ownerWithSensor(t);
  await owner.agent
    .patch(`/api/v1/shops/${owner.shopId}`)
    .send({ name: SHOP_NAME, timeZone: SHOP_TIME_ZONE })
    .expect(200);
  const member = await verifiedPerson(t, 'Member C');
  const memberF = await verifiedPerson(t, 'Member F');
  await memberF.agent.patch('/api/v1/me').send({ unitPref: 'F' }).expect(200);
  const quiet = await verifiedPerson(t, 'Member Off');
  const off = await quiet.agent.patch('/api/v1/me').send({ alarmMail: false }).expect(200);
  if (off.body.user.alarmMail !== false) throw new Error('alarm mail did not turn off');
  const viewer = await verifiedPerson(t, 'Viewer');
  // Made in the database as sign-up makes it (no verified time), without another scrypt hash.
  const unverified = { email: uniqueEmail('unverified') };
  const unverifiedUser = await insertUser(t.db, {
    email: unverified.email,
    name: 'Unverified',
    passwordHash: 'scrypt$unusable',
  });
  if (!unverifiedUser) throw new Error('insert made no account');
  await addMember(t.db, owner.shopId, member.user.id, 'member');
  await addMember(t.db, owner.shopId, memberF.user.id, 'member');
  await addMember(t.db, owner.shopId, quiet.user.id, 'member');
  await addMember(t.db, owner.shopId, viewer.user.id, 'viewer');
  await addMember(t.db, owner.shopId, unverifiedUser.id, 'member');
  return { owner, member, memberF, quiet, viewer, unverified };
}

/**
 * Three readings 0.5 K below the dew point, a minute apart from `startMs` (three confirm wet,
 * ingest/hysteresis.ts, ours), posted one request each; returns the posts and the wet alarm.
 */
export async function openWetAlarm(
  t: TestApp,
  owner: Awaited<ReturnType<typeof ownerWithSensor>>,
  startMs: number,
) {
  const posted = await postEach(
    t.app,
    owner.token,
    [0, 1, 2].map((i) => withMargin(startMs + i * MINUTE_MS, -0.5)),
  );
  return { posted, wet: await onlyAlarm(owner.agent, owner.shopId, 'wet_surface') };
}

/** Runs the mail job for one alarm as pg-boss would, with the clock at `nowMs`. */
export function deliverAt(t: TestApp, alarmId: string, nowMs: number) {
  return deliverAlarmMail(
    { db: t.db, pool: t.pool, mailer: t.mailer, publicUrl: TEST_PUBLIC_URL, now: () => nowMs },
    alarmId,
  );
}

/** The mails to an address other than its account's verification link: the alarm mails. */
export const mailsTo = (t: TestApp, email: string): StoredMail[] =>
  t.outbox.list().filter((m) => m.to.includes(email) && m.subject !== VERIFICATION_SUBJECT);

/** "06:12" in a time zone, by the platform's Intl (not the library the server uses). */
export function clockIn(atIso: string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-GB', {
    timeZone,
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
  }).format(new Date(atIso));
}
