/**
 * Alarm e-mail as pg-boss jobs. The engine's transaction that opens an alarm also inserts its
 * job (pg-boss's `db` option runs the insert on the transaction's own connection), so the job
 * exists exactly when the alarm does: a crash after the commit leaves the job for any instance
 * to run, and a mail server outage never touches ingest — the request only wrote a row. The job
 * id is the alarm's id, so an alarm has one job however many instances run; a job that fails
 * (SMTP refused, relay down) is retried with backoff, and one whose worker died expires and is
 * retried too.
 */
import pg from 'pg';
import type PgBoss from 'pg-boss';

import type { Tx } from '@/db/queries/alarms';

import {
  deliverAlarmMail,
  mailDueAtMs,
  type AlarmMailDeps,
  type AlarmsOpenedHook,
} from '../alarms';
import type { Logger } from '../logger';

export const ALARM_MAIL_QUEUE = 'alarm-mail';

/**
 * Retries: 30 s doubling, 10 times — about eight and a half hours of a relay being away before
 * a mail is given up. A job runs at most 5 min (a slow relay, many recipients) before it counts
 * as failed and is retried.
 */
const QUEUE_OPTIONS = {
  name: ALARM_MAIL_QUEUE,
  policy: 'standard',
  retryLimit: 10,
  retryDelay: 30,
  retryBackoff: true,
  expireInSeconds: 300,
} as const;

export interface AlarmMailQueueOptions {
  logger: Logger;
  /** Per-job retry settings instead of the queue's (tests retry in a second). */
  retry?: { retryDelay: number; retryBackoff: boolean; retryLimit?: number };
}

/** The connection a transaction from db/transaction.ts runs on. */
export function transactionClient(tx: Tx): pg.PoolClient {
  const client = (tx as unknown as { $client?: unknown }).$client;
  if (!(client instanceof pg.Client)) throw new Error('alarm mail: not inside a transaction');
  return client as pg.PoolClient;
}

/**
 * The engine's hook: one job per opened alarm, in the transaction that opened it, behind a
 * savepoint — if the job cannot be written the alarm still commits (and the failure is logged).
 */
export function queueAlarmMails(boss: PgBoss, options: AlarmMailQueueOptions): AlarmsOpenedHook {
  const log = options.logger.child({ component: 'jobs' });
  return async (tx, opened) => {
    const client = transactionClient(tx);
    const db = { executeSql: (text: string, values: unknown[]) => client.query(text, values) };
    await client.query('savepoint alarm_mail');
    try {
      for (const alarm of opened) {
        const id = await boss.send(
          ALARM_MAIL_QUEUE,
          { alarmId: alarm.id },
          {
            id: alarm.id,
            ...options.retry,
            // Humid air waits until it has lasted; the others go now.
            ...(alarm.kind === 'humid_air' ? { startAfter: new Date(mailDueAtMs(alarm)) } : {}),
            db,
          },
        );
        if (id === null) {
          log.error({ alarmId: alarm.id }, 'alarm mail: no job queued (is the queue missing?)');
        }
      }
      await client.query('release savepoint alarm_mail');
    } catch (err) {
      await client.query('rollback to savepoint alarm_mail');
      log.error({ err, alarmIds: opened.map((a) => a.id) }, 'alarm mail: could not queue');
    }
  };
}

/** Creates the queue; run before the engine can open an alarm (a job needs its queue). */
export async function createAlarmMailQueue(boss: PgBoss): Promise<void> {
  await boss.createQueue(ALARM_MAIL_QUEUE, QUEUE_OPTIONS);
}

export interface AlarmMailWorkerOptions extends AlarmMailDeps {
  logger: Logger;
  /** How often an idle worker asks for a job; pg-boss's default is 2 s. */
  pollingIntervalSeconds?: number;
}

/** Works the queue on this instance: each job delivers one alarm's mail. */
export async function workAlarmMails(boss: PgBoss, options: AlarmMailWorkerOptions) {
  await createAlarmMailQueue(boss);
  const log = options.logger.child({ component: 'jobs' });
  return boss.work<{ alarmId?: unknown }>(
    ALARM_MAIL_QUEUE,
    { pollingIntervalSeconds: options.pollingIntervalSeconds ?? 2, batchSize: 5 },
    async (jobs) => {
      // One failure must not fail the batch: each job fails (and is retried) on its own.
      for (const job of jobs) {
        const alarmId = job.data?.alarmId;
        if (typeof alarmId !== 'string') continue;
        try {
          const report = await deliverAlarmMail(options, alarmId);
          if (report.outcome === 'not_due') throw new Error('not due yet');
          if (report.sent > 0) log.info({ alarmId, sent: report.sent }, 'alarm mail: sent');
        } catch (err) {
          const message = err instanceof Error ? err.message : String(err);
          log.warn({ err, alarmId }, 'alarm mail: failed; it will be retried');
          await boss.fail(ALARM_MAIL_QUEUE, job.id, { message });
        }
      }
    },
  );
}
