/**
 * The Monday week-report e-mail: a sweep (run by pg-boss every few minutes, server/jobs/
 * weekReportJob.ts) finds the shops whose last week's mail is due at 07:00 shop time
 * (ingest/weekReportDue.ts) and not yet claimed, and delivers each.
 *
 * Exactly once per shop-week: the delivery claims the week (an insert into week_report_mails,
 * whose primary key only one instance can win), builds the report in each recipient's unit, sends
 * and records the time and count, all in ONE transaction. A second instance's claim waits on the
 * first's uncommitted row (at most `CLAIM_WAIT`, then leaves it to the next sweep) and finds it
 * taken. A process that dies before the commit (a crash, a deploy) rolls its claim back, so the
 * next sweep, on any instance, sends the week again: the mail is never lost, and the only way to
 * get it twice is a crash after the SMTP server took it and before the commit (at least once in
 * that window, exactly once otherwise). An SMTP server that refuses everyone fails the delivery
 * and rolls the claim back too; it is tried again by the next sweep, until the week's turn ends
 * (the next Monday 07:00). If it refuses some people after others got the mail, the week is
 * recorded as sent to those who got it and the rest are logged, not mailed twice to the others.
 */
import type pg from 'pg';
import { sql } from 'drizzle-orm';

import type { Db } from '@/db';
import {
  claimWeekReportMail,
  markWeekReportMailSent,
  shopsDueForWeekReport,
  shopTimeZones,
  weekReportRecipients,
} from '@/db/queries/weekReportMails';
import { withTransaction } from '@/db/transaction';
import { weekReportMailDue } from '@/ingest/weekReportDue';
import type { UnitPref } from '@/ingest/wire/people';
import type { WeekReport } from '@/ingest/wire/reports';

import type { Logger } from '@/server/logger';
import { weekReportMessage, type Mailer } from '@/server/mail';

import { renderWeekReportPdf } from './pdf';
import { buildWeekReport, weekReportSeries } from './weekReport';

/**
 * How long a claim waits for another instance's uncommitted claim of the same shop-week before
 * leaving it to the next sweep: longer than a normal delivery's lock, well under the statement
 * timeout.
 */
const CLAIM_WAIT = '3s';

export interface WeekReportMailDeps {
  db: Db;
  pool: pg.Pool;
  mailer: Mailer;
  /** Where people reach the app; links in the mail start with it. */
  publicUrl: string;
  logger: Logger;
  now?: () => number;
}

export type WeekReportMailOutcome =
  /** Mailed to `sent` people. */
  | 'sent'
  /** Claimed and recorded with no owner or member to mail. */
  | 'nobody'
  /** Another delivery claimed it first (this instance or another). */
  | 'taken'
  /** Another delivery holds the claim right now; the next sweep looks again. */
  | 'busy'
  /** The shop was deleted. */
  | 'gone';

export interface WeekReportMailReport {
  outcome: WeekReportMailOutcome;
  sent: number;
}

/** PostgreSQL's lock_not_available: the claim waited `CLAIM_WAIT` for another's. */
function isLockTimeout(err: unknown): boolean {
  for (let e = err as { code?: unknown; cause?: unknown } | undefined; e; e = e.cause as never) {
    if (e.code === '55P03') return true;
    if (e.cause === e) break;
  }
  return false;
}

/** The PDF of a report; null (logged) when it cannot be made: the mail still goes, without it. */
async function pdfOf(deps: WeekReportMailDeps, report: WeekReport): Promise<Buffer | null> {
  try {
    return await renderWeekReportPdf({ report, series: await weekReportSeries(deps.db, report) });
  } catch (err) {
    deps.logger.error(
      { err, shopId: report.shop.id, weekStart: report.week.start },
      'week report mail: the PDF could not be made; mailing without it',
    );
    return null;
  }
}

/** Claims, builds, sends and records one shop-week's mail (see the file's comment). */
export async function deliverWeekReportMail(
  deps: WeekReportMailDeps,
  shopId: string,
  weekStart: string,
): Promise<WeekReportMailReport> {
  const now = new Date((deps.now ?? Date.now)());
  const log = deps.logger;
  let failure: unknown = null;
  try {
    const report = await withTransaction(deps.pool, async (tx): Promise<WeekReportMailReport> => {
      await tx.execute(sql.raw(`set local lock_timeout = '${CLAIM_WAIT}'`));
      if (!(await claimWeekReportMail(tx, shopId, weekStart))) {
        return { outcome: 'taken', sent: 0 };
      }
      const everyone = await weekReportRecipients(tx, shopId);
      // One report (and PDF) per unit someone reads in: the verdicts are written in it.
      const byUnit = new Map<UnitPref, { report: WeekReport; pdf: Buffer | null }>();
      for (const unit of new Set(everyone.map((p) => p.unitPref))) {
        const built = await buildWeekReport(deps.db, { shopId, start: weekStart, unit, now });
        if (!built) return { outcome: 'gone', sent: 0 };
        byUnit.set(unit, { report: built, pdf: await pdfOf(deps, built) });
      }
      const shopUrl = `${deps.publicUrl}/shops/${encodeURIComponent(shopId)}`;
      let sent = 0;
      const missed: string[] = [];
      for (const person of everyone) {
        const { report: built, pdf } = byUnit.get(person.unitPref)!;
        try {
          await deps.mailer.send(
            weekReportMessage({
              to: person.email,
              role: person.role,
              report: built,
              pdf,
              reportUrl: `${shopUrl}/report?week=${weekStart}`,
              profileUrl: `${shopUrl}/profile`,
            }),
          );
          sent += 1;
        } catch (err) {
          failure ??= err;
          missed.push(person.userId);
        }
      }
      // Nobody got it: roll the claim back and let the next sweep try the whole week again.
      if (sent === 0 && missed.length > 0) throw failure;
      if (missed.length > 0) {
        log.error(
          { err: failure, shopId, weekStart, sent, missedUserIds: missed },
          'week report mail: the SMTP server refused some recipients; the others have it',
        );
      }
      await markWeekReportMailSent(tx, { shopId, weekStart, sentAt: now, recipients: sent });
      return { outcome: everyone.length === 0 ? 'nobody' : 'sent', sent };
    });
    return report;
  } catch (err) {
    if (isLockTimeout(err)) return { outcome: 'busy', sent: 0 };
    throw err;
  }
}

export interface WeekReportSweepOutcome {
  /** Shop-weeks found due and unclaimed. */
  due: number;
  /** Of those, delivered by this sweep (mailed or recorded with nobody to mail). */
  delivered: number;
  /** Messages handed to the SMTP server. */
  mails: number;
  /** Deliveries that failed (logged); the next sweep tries them again. */
  failed: number;
}

/**
 * Finds and delivers every shop-week due at `now`: the due week is worked out once per time
 * zone, then the shops of that zone without a claim for it. One shop's failure does not stop
 * the others.
 */
export async function sweepWeekReportMails(
  deps: WeekReportMailDeps,
): Promise<WeekReportSweepOutcome> {
  const nowMs = (deps.now ?? Date.now)();
  const outcome: WeekReportSweepOutcome = { due: 0, delivered: 0, mails: 0, failed: 0 };
  for (const timeZone of await shopTimeZones(deps.db)) {
    const week = weekReportMailDue(nowMs, timeZone);
    const shopIds = await shopsDueForWeekReport(deps.db, {
      timeZone,
      weekStart: week.start,
      createdBefore: new Date(week.toMs),
    });
    outcome.due += shopIds.length;
    for (const shopId of shopIds) {
      try {
        const report = await deliverWeekReportMail(deps, shopId, week.start);
        if (report.outcome === 'sent' || report.outcome === 'nobody') outcome.delivered += 1;
        outcome.mails += report.sent;
      } catch (err) {
        outcome.failed += 1;
        deps.logger.warn(
          { err, shopId, weekStart: week.start },
          'week report mail: delivery failed; the next sweep tries again',
        );
      }
    }
  }
  return outcome;
}
