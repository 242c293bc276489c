/**
 * How much of a timed window the server's roll-up job (server/jobs/readingRollupJob.ts, every
 * 5 minutes) was running in: it shares the machine's two cores with the queries timed, so a
 * figure taken while it re-rolled a bench's freshly loaded week is the job's as much as the
 * query's. Read from pg-boss's own job table (pg-boss 10: pgboss.job).
 */
import type pg from 'pg';

import { READING_ROLLUP_QUEUE } from '@/server/jobs';

export interface RollupOverlap {
  /** Runs of the job that overlapped the window. */
  runs: number;
  /** Seconds of the window during which a run was going. */
  seconds: number;
}

export async function rollupRunsBetween(
  pool: pg.Pool,
  fromMs: number,
  toMs: number,
): Promise<RollupOverlap> {
  const result = await pool.query<{ runs: number; seconds: number | null }>(
    `select count(*)::int as runs,
            sum(extract(epoch from least(coalesce(completed_on, now()), $3::timestamptz)
                                   - greatest(started_on, $2::timestamptz)))::float8 as seconds
     from pgboss.job
     where name = $1 and started_on is not null and started_on < $3::timestamptz
       and coalesce(completed_on, now()) > $2::timestamptz`,
    [READING_ROLLUP_QUEUE, new Date(fromMs), new Date(toMs)],
  );
  const r = result.rows[0];
  return { runs: r?.runs ?? 0, seconds: Number(r?.seconds ?? 0) };
}
