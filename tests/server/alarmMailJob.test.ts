// Alarm e-mail end to end through pg-boss while the SMTP server is down: ingest answers 202 at
// once (the request only queued a job in the engine's transaction), the job fails and is
// retried, and the mail goes out once the server is back. Also the outage with the job run by
// hand: who had the mail is recorded, so a retry continues without repeating anyone.
import net from 'node:net';

import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { findAlarmMail } from '@/db/queries/alarmMailRecords';
import { deliverAlarmMail } from '@/server/alarms';
import { ALARM_MAIL_QUEUE, workAlarmMails } from '@/server/jobs';
import { silentLogger } from '@/server/logger';
import { createMailer, createOutbox, startLocalSmtpServer, type Outbox } from '@/server/mail';

import { MINUTE_MS } from '../support/alarms';
import { openWetAlarm, SHOP_NAME, shopWithPeople, startMailTestApp } from '../support/alarmMailApp';
import { TEST_PUBLIC_URL, type TestApp } from '../support/app';
import { captureLogs } from '../support/logs';
import { waitForMail } from '../support/mail';

let boss: PgBoss;
let t: TestApp;
beforeAll(async () => void ({ boss, t } = await startMailTestApp('pgboss_mail_jobs')));
afterAll(async () => {
  await boss?.stop({ graceful: false });
  await t?.pool.end();
});

/** A loopback port nobody listens on (taken from the OS, then let go). */
async function freePort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  await new Promise((resolve) => server.close(resolve));
  return port;
}

/**
 * A mailer aimed at `port`, where the SMTP server is down until `bringUp` starts it; with
 * `stopAfter` the server stops listening once it has taken that many messages (the relay going
 * away in the middle of a job).
 */
async function smtpDownAtFirst() {
  const port = await freePort();
  const outbox: Outbox = createOutbox();
  const mailer = createMailer({
    from: 'Drybench <no-reply@drybench.example>',
    target: Promise.resolve({ host: '127.0.0.1', port, requireTls: false }),
  });
  async function bringUp(stopAfter = Infinity) {
    let taken = 0;
    const server = await startLocalSmtpServer({
      port,
      logger: silentLogger(),
      outbox: {
        ...outbox,
        add(mail) {
          taken += 1;
          if (taken >= stopAfter) void server.close();
          return outbox.add(mail);
        },
      },
    });
    return server;
  }
  return { mailer, outbox, bringUp };
}

describe('the mail job while the SMTP server is down', () => {
  it('fails, and each later run mails only those who have not had it', async () => {
    const smtp = await smtpDownAtFirst();
    const p = await shopWithPeople(t);
    const { wet } = await openWetAlarm(t, p.owner, Date.now() - 2 * MINUTE_MS);
    const deps = { db: t.db, pool: t.pool, mailer: smtp.mailer, publicUrl: TEST_PUBLIC_URL };
    const received = () => smtp.outbox.list().flatMap((m) => m.to);

    await expect(deliverAlarmMail(deps, wet.id)).rejects.toThrow(/ECONNREFUSED/);
    expect(await findAlarmMail(t.db, wet.id)).toMatchObject({ outcome: 'sending', sentTo: [] });

    // Back, but gone again after one message: that one person is recorded.
    await smtp.bringUp(1);
    await expect(deliverAlarmMail(deps, wet.id)).rejects.toThrow(/ECONNREFUSED/);
    expect(received()).toHaveLength(1);
    expect((await findAlarmMail(t.db, wet.id))?.sentTo).toHaveLength(1);

    const server = await smtp.bringUp();
    try {
      expect(await deliverAlarmMail(deps, wet.id)).toEqual({ outcome: 'sent', sent: 2 });
      expect(received().sort()).toEqual([p.owner.email, p.member.email, p.memberF.email].sort());
    } finally {
      await server.close();
    }
  });
});

describe('through pg-boss', () => {
  it('answers ingest at once while mail is down, retries the job, and mails once the server is back', async () => {
    const smtp = await smtpDownAtFirst();
    const logs = captureLogs();
    await workAlarmMails(boss, {
      db: t.db,
      pool: t.pool,
      mailer: smtp.mailer,
      publicUrl: TEST_PUBLIC_URL,
      logger: logs.logger,
      pollingIntervalSeconds: 0.5,
    });
    const server = { close: async () => {} };
    try {
      const p = await shopWithPeople(t);
      const started = Date.now();
      // Each request answers 202 (checked inside); they wrote rows and a job, and nothing
      // waited on SMTP.
      const { wet } = await openWetAlarm(t, p.owner, Date.now() - 2 * MINUTE_MS);
      expect(Date.now() - started).toBeLessThan(5_000);
      expect(smtp.outbox.list()).toEqual([]);

      // The worker takes the job, cannot reach the SMTP server, and pg-boss schedules a retry.
      await expect
        .poll(async () => (await boss.getJobById(ALARM_MAIL_QUEUE, wet.id))?.retryCount ?? 0, {
          timeout: 15_000,
          interval: 200,
        })
        .toBeGreaterThanOrEqual(1);
      // The failure is in the server's log, tagged with the job runner and the alarm.
      expect(logs.lines()).toContainEqual(
        expect.objectContaining({
          component: 'jobs',
          alarmId: wet.id,
          msg: 'alarm mail: failed; it will be retried',
          err: expect.objectContaining({ message: expect.stringMatching(/ECONNREFUSED/) }),
        }),
      );
      expect(smtp.outbox.list()).toEqual([]);

      server.close = (await smtp.bringUp()).close;
      const mail = await waitForMail(smtp.outbox, p.owner.email, { timeoutMs: 15_000 });
      expect(mail.subject).toBe(`Machine room: wet, margin -0.5 °C — ${SHOP_NAME}`);
      await waitForMail(smtp.outbox, p.memberF.email, { timeoutMs: 5_000 });
      await expect
        .poll(async () => (await boss.getJobById(ALARM_MAIL_QUEUE, wet.id))?.state, {
          timeout: 10_000,
          interval: 200,
        })
        .toBe('completed');
      const forThisShop = smtp.outbox
        .list()
        .filter((m) =>
          [p.owner, p.member, p.memberF, p.quiet, p.viewer].some((u) => m.to.includes(u.email)),
        );
      expect(forThisShop).toHaveLength(3);
    } finally {
      await boss.offWork(ALARM_MAIL_QUEUE);
      await server.close();
    }
  });
});
