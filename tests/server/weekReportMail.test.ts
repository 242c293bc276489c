// The Monday week-report e-mail: the sweep with an injected clock (never waited for), real
// PostgreSQL, real pg-boss and a real SMTP server (tests/support/mail.ts). Shops here are dated
// back with created_at so the weeks are fixed ones across daylight-saving changes; every other
// test file's shop was made after those weeks and is never due in them.
import type PgBoss from 'pg-boss';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { findWeekReportMail } from '@/db/queries/weekReportMails';
import { addMember } from '@/db/queries/memberships';
import { insertUser } from '@/db/queries/users';
import { scheduleWeekReportMails, startJobRunner, WEEK_REPORT_QUEUE } from '@/server/jobs';
import { silentLogger } from '@/server/logger';
import type { Mailer, MailMessage, Outbox, StoredMail } from '@/server/mail';
import {
  deliverWeekReportMail,
  sweepWeekReportMails,
  type WeekReportMailDeps,
} from '@/server/reports/weekReportMail';

import { postBatch, withMargin } from '../support/alarms';
import {
  makeTestApp,
  ownerWithSensor,
  TEST_PUBLIC_URL,
  uniqueEmail,
  verifiedPerson,
  type TestApp,
} from '../support/app';
import { waitForMail } from '../support/mail';

const MINUTE_MS = 60_000;
const iso = (text: string) => Date.parse(text);

let t: TestApp;
let t2: TestApp;
beforeAll(() => {
  // With the development outbox page, as `npm start` serves it.
  t = makeTestApp({ devOutbox: true });
  // A second server instance: its own pool and its own SMTP connection, the same database.
  t2 = makeTestApp();
});
afterAll(async () => {
  await t.pool.end();
  await t2.pool.end();
});

function depsOf(app: TestApp, nowMs: number, mailer: Mailer = app.mailer): WeekReportMailDeps {
  return {
    db: app.db,
    pool: app.pool,
    mailer,
    publicUrl: TEST_PUBLIC_URL,
    logger: silentLogger(),
    now: () => nowMs,
  };
}

/**
 * A shop in `timeZone` made at `createdAt` (dated back in the database), with its owner in °C,
 * a member in °F, a member who turned the week report off, a viewer, and a member who never
 * verified the address; the switches and units set through the API.
 */
async function shopWithPeople(name: string, timeZone: string, createdAt: string) {
  const owner = await ownerWithSensor(t);
  await owner.agent.patch(`/api/v1/shops/${owner.shopId}`).send({ name, timeZone }).expect(200);
  await t.pool.query('update shops set created_at = $2 where id = $1', [owner.shopId, createdAt]);
  const memberF = await verifiedPerson(t, 'Member F');
  await memberF.agent.patch('/api/v1/me').send({ unitPref: 'F' }).expect(200);
  const quiet = await verifiedPerson(t, 'Member Off');
  const off = await quiet.agent.patch('/api/v1/me').send({ weekReportMail: false }).expect(200);
  expect(off.body.user.weekReportMail).toBe(false);
  const viewer = await verifiedPerson(t, 'Viewer');
  const unverified = uniqueEmail('unverified');
  const unverifiedUser = await insertUser(t.db, {
    email: unverified,
    name: 'Unverified',
    passwordHash: 'scrypt$unusable',
  });
  await addMember(t.db, owner.shopId, memberF.user.id, 'member');
  await addMember(t.db, owner.shopId, quiet.user.id, 'member');
  await addMember(t.db, owner.shopId, viewer.user.id, 'viewer');
  await addMember(t.db, owner.shopId, unverifiedUser!.id, 'member');
  return {
    owner,
    memberF,
    /** Who must never get the mail. */
    none: [quiet.email, viewer.email, unverified],
  };
}

type People = Awaited<ReturnType<typeof shopWithPeople>>;

const WEEK_SUBJECT = /^Week report: /;
const weekMails = (outbox: Outbox, email: string): StoredMail[] =>
  outbox.list().filter((m) => m.to.includes(email) && WEEK_SUBJECT.test(m.subject));

/** Week mails to each person across the outboxes of both instances. */
function countsOf(p: People) {
  const count = (email: string) =>
    weekMails(t.outbox, email).length + weekMails(t2.outbox, email).length;
  return {
    owner: count(p.owner.email),
    memberF: count(p.memberF.email),
    none: p.none.map(count),
  };
}

/** Lets SMTP deliveries in flight reach the outbox (the send resolves when the server took it). */
async function settle() {
  await new Promise((r) => setTimeout(r, 100));
}

describe('the Berlin week of 23 March 2026 (167 h: EU summer time from 29 March)', () => {
  let p: People;
  beforeAll(async () => {
    // Made on Wednesday 25 March, mid-week: its first report is of that week.
    p = await shopWithPeople('Linden Yard Joinery & Sons', 'Europe/Berlin', '2026-03-25T09:00:00Z');
    // Thursday 26 March, CET (UTC+1): a reading every 10 min from 05:00 to 08:00 shop time,
    // 5 K above the dew point except 06:00-06:50, six readings at or below the 1 K wet limit
    // (the zone's default, db/schema/sensing.ts) with the lowest, 0.4 K, at 06:10.
    const wet = [0.8, 0.4, 0.6, 0.7, 0.8, 0.9];
    const readings = Array.from({ length: 19 }, (_, i) => {
      const atMs = iso('2026-03-26T04:00:00Z') + i * 10 * MINUTE_MS;
      return withMargin(atMs, i >= 6 && i < 12 ? wet[i - 6]! : 5);
    });
    await postBatch(t.app, p.owner.token, readings);
  });

  it('is not due at 06:59 CEST on Monday 30 March (04:59Z): nobody is mailed', async () => {
    const outcome = await sweepWeekReportMails(depsOf(t, iso('2026-03-30T04:59:00Z')));
    await settle();
    expect(countsOf(p)).toEqual({ owner: 0, memberF: 0, none: [0, 0, 0] });
    // The week before is the one due then, and this shop did not exist in it.
    expect(await findWeekReportMail(t.db, p.owner.shopId, '2026-03-16')).toBeNull();
    expect(await findWeekReportMail(t.db, p.owner.shopId, '2026-03-23')).toBeNull();
    expect(outcome.failed).toBe(0);
  });

  it('goes at 07:00 CEST (05:00Z) to the verified owner and member with it on, once', async () => {
    const nowMs = iso('2026-03-30T05:00:00Z');
    await sweepWeekReportMails(depsOf(t, nowMs));
    const owner = await waitForMail(t.outbox, p.owner.email, { subject: WEEK_SUBJECT });
    const memberF = await waitForMail(t.outbox, p.memberF.email, { subject: WEEK_SUBJECT });
    await settle();
    // The member who turned it off, the viewer and the unverified address get none.
    expect(countsOf(p)).toEqual({ owner: 1, memberF: 1, none: [0, 0, 0] });
    const row = await findWeekReportMail(t.db, p.owner.shopId, '2026-03-23');
    expect(row?.sentAt?.toISOString()).toBe('2026-03-30T05:00:00.000Z');
    expect(row?.recipients).toBe(2);

    // Subject: the shop and the week, Monday 23 to Sunday 29 March 2026.
    expect(owner.subject).toBe(
      'Week report: Linden Yard Joinery & Sons, Mon 23 Mar – Sun 29 Mar 2026',
    );
    expect(owner.text.split('\n')[0]).toBe(
      'Linden Yard Joinery & Sons: the week Mon 23 Mar – Sun 29 Mar 2026 (167 h, Europe/Berlin time).',
    );
    // A name people typed is escaped in the HTML part.
    expect(owner.html).toContain('Linden Yard Joinery &amp; Sons');
    expect(owner.html).not.toContain('Joinery & Sons');
    // The link to the Report screen of that week, and how to turn the mail off.
    const shopUrl = `${TEST_PUBLIC_URL}/shops/${p.owner.shopId}`;
    expect(owner.text).toContain(`${shopUrl}/report?week=2026-03-23`);
    expect(owner.text).toContain(
      `“Week report e-mail on Mondays” under Profile: ${shopUrl}/profile`,
    );
    expect(owner.html).toContain(`${shopUrl}/report?week=2026-03-23`);

    // The zone line in the reader's unit. Lowest margin 0.4 K at 06:10 CET (05:10Z); as a
    // difference in °F it scales by 1.8 with no offset: 0.72 → +0.7 °F. Wet: six readings ten
    // minutes apart, 60 min → 1 h.
    expect(owner.text).toContain(
      'Machine room: lowest dew margin +0.4 °C (Thu 26 Mar 06:10), wet 1 h',
    );
    expect(memberF.text).toContain(
      'Machine room: lowest dew margin +0.7 °F (Thu 26 Mar 06:10), wet 1 h',
    );
    // Every sentence of the °F reader's mail is in °F.
    expect(memberF.text).not.toContain('°C');

    // The PDF, named for the week's Monday.
    for (const mail of [owner, memberF]) {
      expect(mail.attachments.map((a) => [a.filename, a.contentType])).toEqual([
        ['drybench-week-2026-03-23.pdf', 'application/pdf'],
      ]);
      expect(mail.attachments[0]!.content.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    }

    // The development outbox lists the mail with its PDF, which downloads as sent.
    const page = await request(t.app).get('/dev/outbox').expect(200);
    expect(page.text).toContain(`/dev/outbox/${owner.id}/attachments/0`);
    expect(page.text).toContain('drybench-week-2026-03-23.pdf');
    const file = await request(t.app)
      .get(`/dev/outbox/${owner.id}/attachments/0`)
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => done(null, Buffer.concat(chunks)));
      })
      .expect(200);
    expect(file.headers['content-type']).toBe('application/pdf');
    expect(file.headers['content-disposition']).toContain('drybench-week-2026-03-23.pdf');
    expect(Buffer.compare(file.body as Buffer, owner.attachments[0]!.content)).toBe(0);
    await request(t.app).get(`/dev/outbox/${owner.id}/attachments/1`).expect(404);
  });

  it('sends nothing more on later sweeps (a restart, the rest of the week)', async () => {
    for (const now of ['2026-03-30T05:05:00Z', '2026-04-02T10:00:00Z', '2026-04-06T04:59:00Z']) {
      const outcome = await sweepWeekReportMails(depsOf(t2, iso(now)));
      expect(outcome.failed).toBe(0);
    }
    await settle();
    expect(countsOf(p)).toEqual({ owner: 1, memberF: 1, none: [0, 0, 0] });
  });
});

describe('two instances at the Chicago Monday 2 November 2026, 07:00 CST (13:00Z)', () => {
  it('mails each recipient once when both sweep at the same moment, and never again', async () => {
    // Made on Wednesday 28 October, in the week of 26 October (169 h: US daylight time ended
    // 1 November); the week before is not its to get.
    const p = await shopWithPeople('Prairie Ash Works', 'America/Chicago', '2026-10-28T15:00:00Z');
    await Promise.all([
      sweepWeekReportMails(depsOf(t, iso('2026-11-02T12:59:00Z'))),
      sweepWeekReportMails(depsOf(t2, iso('2026-11-02T12:59:00Z'))),
    ]);
    await settle();
    expect(countsOf(p)).toEqual({ owner: 0, memberF: 0, none: [0, 0, 0] });

    // 07:00 CST: both instances sweep at once; each finds the shop due and tries to claim it.
    const nowMs = iso('2026-11-02T13:00:00Z');
    await Promise.all([
      sweepWeekReportMails(depsOf(t, nowMs)),
      sweepWeekReportMails(depsOf(t2, nowMs)),
    ]);
    await settle();
    expect(countsOf(p)).toEqual({ owner: 1, memberF: 1, none: [0, 0, 0] });
    const mail = weekMails(t.outbox, p.owner.email)[0] ?? weekMails(t2.outbox, p.owner.email)[0];
    expect(mail?.subject).toBe('Week report: Prairie Ash Works, Mon 26 Oct – Sun 1 Nov 2026');
    expect(mail?.text.split('\n')[0]).toBe(
      'Prairie Ash Works: the week Mon 26 Oct – Sun 1 Nov 2026 (169 h, America/Chicago time).',
    );

    // Two deliveries of the same shop-week racing head on: the claim is taken for both.
    const raced = await Promise.all([
      deliverWeekReportMail(depsOf(t, nowMs), p.owner.shopId, '2026-10-26'),
      deliverWeekReportMail(depsOf(t2, nowMs), p.owner.shopId, '2026-10-26'),
    ]);
    expect(raced).toEqual([
      { outcome: 'taken', sent: 0 },
      { outcome: 'taken', sent: 0 },
    ]);

    // Both instances restart and sweep again, then again on Wednesday: nothing more.
    await Promise.all([
      sweepWeekReportMails(depsOf(t, iso('2026-11-02T13:05:00Z'))),
      sweepWeekReportMails(depsOf(t2, iso('2026-11-02T13:05:00Z'))),
    ]);
    await sweepWeekReportMails(depsOf(t2, iso('2026-11-04T15:00:00Z')));
    await settle();
    expect(countsOf(p)).toEqual({ owner: 1, memberF: 1, none: [0, 0, 0] });
    expect((await findWeekReportMail(t.db, p.owner.shopId, '2026-10-26'))?.recipients).toBe(2);
  });
});

describe('a delivery that fails before any mail left', () => {
  it('rolls its claim back, and the next sweep sends the week', async () => {
    const p = await shopWithPeople('Cedar Bend Shop', 'America/Chicago', '2026-09-01T12:00:00Z');
    // Chicago, Monday 7 September 2026 07:00 CDT = 12:00Z: the week of 31 August is due.
    const nowMs = iso('2026-09-07T12:00:00Z');
    const refusing: Mailer = {
      send: (message: MailMessage) =>
        Promise.reject(new Error(`relay refused ${message.to}: 451 try again later`)),
    };
    const first = await sweepWeekReportMails(depsOf(t, nowMs, refusing));
    expect(first.failed).toBeGreaterThanOrEqual(1);
    // Nothing recorded: a crash at this point leaves the same state (the claim is uncommitted).
    expect(await findWeekReportMail(t.db, p.owner.shopId, '2026-08-31')).toBeNull();

    await sweepWeekReportMails(depsOf(t2, nowMs + 5 * MINUTE_MS));
    await waitForMail(t2.outbox, p.owner.email, { subject: WEEK_SUBJECT });
    await settle();
    expect(countsOf(p)).toEqual({ owner: 1, memberF: 1, none: [0, 0, 0] });
    const row = await findWeekReportMail(t.db, p.owner.shopId, '2026-08-31');
    expect(row?.sentAt?.toISOString()).toBe('2026-09-07T12:05:00.000Z');
  });
});

describe('a relay that refuses one recipient after another got the mail', () => {
  it('records the week as sent to those who got it and mails nobody twice', async () => {
    const p = await shopWithPeople('Birchwood Row', 'America/Chicago', '2026-09-15T12:00:00Z');
    // Chicago, Monday 21 September 2026 07:00 CDT = 12:00Z: the week of 14 September is due.
    const nowMs = iso('2026-09-21T12:00:00Z');
    const refusingF: Mailer = {
      send: (message: MailMessage) =>
        message.to === p.memberF.email
          ? Promise.reject(new Error(`550 mailbox unavailable: ${message.to}`))
          : t.mailer.send(message),
    };
    const report = await deliverWeekReportMail(
      depsOf(t, nowMs, refusingF),
      p.owner.shopId,
      '2026-09-14',
    );
    expect(report).toEqual({ outcome: 'sent', sent: 1 });
    await waitForMail(t.outbox, p.owner.email, { subject: WEEK_SUBJECT });
    const row = await findWeekReportMail(t.db, p.owner.shopId, '2026-09-14');
    expect(row?.recipients).toBe(1);
    // Later sweeps with a working relay do not send the owner a second copy.
    await sweepWeekReportMails(depsOf(t, nowMs + 5 * MINUTE_MS));
    await settle();
    expect(countsOf(p)).toEqual({ owner: 1, memberF: 0, none: [0, 0, 0] });
  });
});

describe('the schedule on pg-boss, twice started', () => {
  const bosses: PgBoss[] = [];
  afterAll(async () => {
    await Promise.all(bosses.map((b) => b.stop({ graceful: false, wait: true })));
  });

  it('works sweeps from both instances, catches up after a down Monday, mails each once', async () => {
    const p = await shopWithPeople('Alder Hollow Mill', 'Europe/Berlin', '2026-06-01T08:00:00Z');
    // Both servers were down on Monday 15 June and come back on Wednesday 17 June, 11:00 CEST
    // (09:00Z): the week of 8 June is still due (until Monday 22 June 07:00) and goes now.
    const nowMs = iso('2026-06-17T09:00:00Z');
    // Two runners without cron on a schema of this file's own (no other file's worker takes
    // these jobs), each working the queue with that clock.
    // One after the other: the first start installs pg-boss's schema.
    for (const app of [t, t2]) {
      const boss = await startJobRunner({
        databaseUrl: process.env.DATABASE_URL!,
        logger: silentLogger(),
        cron: false,
        schema: 'pgboss_week_report_test',
      });
      bosses.push(boss);
      await scheduleWeekReportMails(boss, {
        ...depsOf(app, nowMs),
        schedule: false,
        pollingIntervalSeconds: 0.5,
      });
    }
    // What the cron would insert, from each instance: two sweep jobs.
    const ids = await Promise.all(bosses.map((boss) => boss.send(WEEK_REPORT_QUEUE, {})));
    expect(ids.every((id) => typeof id === 'string')).toBe(true);
    await expect
      .poll(
        async () =>
          Promise.all(
            ids.map(async (id, i) => (await bosses[i]!.getJobById(WEEK_REPORT_QUEUE, id!))?.state),
          ),
        { timeout: 20_000, interval: 200 },
      )
      .toEqual(['completed', 'completed']);
    await settle();
    expect(countsOf(p)).toEqual({ owner: 1, memberF: 1, none: [0, 0, 0] });
    expect(
      (await findWeekReportMail(t.db, p.owner.shopId, '2026-06-08'))?.sentAt?.toISOString(),
    ).toBe('2026-06-17T09:00:00.000Z');
  });
});
