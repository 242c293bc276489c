/**
 * Alarm e-mails, the decision: who hears of which alarm, when, and how often. The engine queues
 * one pg-boss job per opened alarm inside the transaction that opened it (the job:
 * server/jobs/alarmMailJob.ts); the job calls deliverAlarmMail, which decides once per alarm
 * under a lock (the record of who got it: db/queries/alarmMailRecords.ts), then sends one
 * message per recipient in their own unit (the message: server/mail/alarmMessage.ts) and records
 * each, so a retry after a mail-server failure continues with the people not yet mailed. A
 * process that dies while sending loses that run's record, and the retry mails those people
 * again: at least once, not exactly once.
 */
import type pg from 'pg';

import type { Db } from '@/db';
import {
  alarmForMail,
  alarmMailRecipients,
  claimAlarmMail,
  finishAlarmMail,
  lockAlarmMail,
  markAlarmMailSentTo,
  readingBehindAlarm,
} from '@/db/queries/alarmMailRecords';
import type { AlarmRow } from '@/db/queries/alarms';
import type { AlarmMailOutcome } from '@/db/schema';
import { withTransaction } from '@/db/transaction';

import { alarmMessage, type Mailer } from '../mail';

const MINUTE_MS = 60_000;
const HOUR_MS = 60 * MINUTE_MS;

/** Every kind is mailed when it opens, humid air only once it has lasted `humidAfterMs`. */
export const ALARM_MAIL_RULES = {
  /**
   * Ours: damp air is slow harm (rust speeds up over days, not minutes) and the commonest alarm
   * in a wet season, so a mail for every 30-minute spell would teach people to ignore Drybench
   * mail. Two hours of it is worth a look at the machines; a passing shower is not.
   */
  humidAfterMs: 2 * HOUR_MS,
  /**
   * Our own rule, no standard's: at most one mail per zone and kind per 30 min (by the alarms'
   * opening times). The engine's hysteresis already keeps one alarm from flapping; this keeps a
   * condition that clears and comes back (a door opened and shut on a wet morning) from sending
   * a storm. The Alarms page still lists every alarm.
   */
  capMs: 30 * MINUTE_MS,
  /**
   * Ours: a sensor's backlog can open alarms hours after they happened; six hours on they are
   * history for the Alarms page, not a call to act.
   */
  staleAfterMs: 6 * HOUR_MS,
  /** A job may start this much before it is due by our clock (the database keeps pg-boss's). */
  clockSlackMs: MINUTE_MS,
} as const;

/** When an alarm's mail is due: when it opened, or once humid air has lasted its hold. */
export function mailDueAtMs(alarm: Pick<AlarmRow, 'kind' | 'sinceAt' | 'openedAt'>): number {
  const openedMs = alarm.openedAt.getTime();
  if (alarm.kind !== 'humid_air') return openedMs;
  return Math.max(openedMs, alarm.sinceAt.getTime() + ALARM_MAIL_RULES.humidAfterMs);
}

/** What to do with an alarm's mail at `nowMs`; null when it is not due yet. */
export function decideAlarmMail(
  alarm: Pick<AlarmRow, 'kind' | 'sinceAt' | 'openedAt' | 'clearedAt'>,
  facts: { mailedNearby: boolean; wetOpen: boolean },
  nowMs: number,
): AlarmMailOutcome | null {
  const rules = ALARM_MAIL_RULES;
  // Over before its mail went (humid air that did not last, a backlog's closed spell).
  if (alarm.clearedAt !== null) return 'cleared';
  const dueMs = mailDueAtMs(alarm);
  if (nowMs < dueMs - rules.clockSlackMs) return null;
  if (nowMs - dueMs > rules.staleAfterMs) return 'stale';
  // The iron is wet already (both often open on the same reading): the wet mail says more. A
  // dew-risk warning that came first was mailed when it opened.
  if (alarm.kind === 'dew_risk' && facts.wetOpen) return 'covered';
  return facts.mailedNearby ? 'capped' : 'sending';
}

export interface AlarmMailDeps {
  db: Db;
  pool: pg.Pool;
  mailer: Mailer;
  /** Where people reach the app; links in the mail start with it. */
  publicUrl: string;
  now?: () => number;
}

export interface AlarmMailReport {
  /** `gone`: the alarm was deleted with its shop; `not_due`: try again later. */
  outcome: AlarmMailOutcome | 'gone' | 'not_due';
  /** Messages this call handed to the SMTP server. */
  sent: number;
}

/**
 * Decides and sends one alarm's mail. Throws when the SMTP server refuses or cannot be reached,
 * after recording who has had it; calling again (pg-boss's retry) continues from there.
 */
export async function deliverAlarmMail(
  deps: AlarmMailDeps,
  alarmId: string,
): Promise<AlarmMailReport> {
  const nowMs = (deps.now ?? Date.now)();
  const claim = await claimAlarmMail(
    deps.pool,
    { alarmId, capMs: ALARM_MAIL_RULES.capMs, decidedAt: new Date(nowMs) },
    ({ alarm, ...facts }) => decideAlarmMail(alarm, facts, nowMs),
  );
  if (claim.state === 'gone') return { outcome: 'gone', sent: 0 };
  if (claim.state === 'undecided') return { outcome: 'not_due', sent: 0 };
  if (claim.row.outcome !== 'sending') return { outcome: claim.row.outcome, sent: 0 };

  // The row stays locked while the mail goes out (seconds at most), so a second run of this job
  // waits and then sends to nobody twice. What was sent is committed even when a send fails.
  let failure: unknown = null;
  const report = await withTransaction(deps.pool, async (tx): Promise<AlarmMailReport> => {
    const row = await lockAlarmMail(tx, alarmId);
    const found = await alarmForMail(tx, alarmId);
    if (!row || !found) return { outcome: 'gone', sent: 0 };
    if (row.outcome !== 'sending') return { outcome: row.outcome, sent: 0 };
    const at = new Date(nowMs);
    const { alarm } = found;
    // A retry after an outage: those not mailed yet need no mail about an alarm that is over.
    if (alarm.clearedAt !== null) {
      await finishAlarmMail(tx, alarmId, 'cleared', at);
      return { outcome: 'cleared', sent: 0 };
    }
    const everyone = await alarmMailRecipients(tx, alarm.shopId);
    if (everyone.length === 0 && row.sentTo.length === 0) {
      await finishAlarmMail(tx, alarmId, 'nobody', at);
      return { outcome: 'nobody', sent: 0 };
    }
    const reading = await readingBehindAlarm(tx, alarm);
    const shopUrl = `${deps.publicUrl}/shops/${encodeURIComponent(alarm.shopId)}`;
    let sent = 0;
    for (const person of everyone.filter((p) => !row.sentTo.includes(p.userId))) {
      try {
        await deps.mailer.send(
          alarmMessage({
            to: person.email,
            role: person.role,
            unit: person.unitPref,
            shopName: found.shopName,
            timeZone: found.timeZone,
            alarm: { ...alarm, zoneName: found.zoneName, sensorName: found.sensorName },
            limits: { cautionK: found.cautionK, wetK: found.wetK, humidRhPct: found.humidRhPct },
            reading,
            alarmsUrl: `${shopUrl}/alarms`,
            profileUrl: `${shopUrl}/profile`,
          }),
        );
      } catch (err) {
        failure = err;
        return { outcome: 'sending', sent };
      }
      await markAlarmMailSentTo(tx, alarmId, person.userId);
      sent += 1;
    }
    await finishAlarmMail(tx, alarmId, 'sent', at);
    return { outcome: 'sent', sent };
  });
  if (failure !== null) throw failure;
  return report;
}
