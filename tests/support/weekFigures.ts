// The reference for the week figures the database computes (db/queries/reports.ts, over raw
// readings or hourly roll-ups): ingest/reportWeek.ts weekFiguresFromReadings, the rule itself
// in JavaScript, over the very rows a test stored; the comparison of the two; and the seeded
// generator the messy series are drawn from, so a failure replays.
import { expect } from 'vitest';

import type { ReadingRow } from '@/db/queries/readings';
import type { Level } from '@/ingest/levels';
import { weekFiguresFromReadings, type ReportReading, type WeekFigures } from '@/ingest/reportWeek';
import { TOW_MAX_GAP_MS } from '@/ingest/wetness';

/** mulberry32: a small seeded generator, so a failure can be replayed. */
export function seededRandom(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let x = Math.imul(a ^ (a >>> 15), 1 | a);
    x = (x + Math.imul(x ^ (x >>> 7), 61 | x)) ^ x;
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
}

export const LEVELS: readonly Level[] = ['dry', 'close', 'wet', 'unknown'];

function toReportReading(r: ReadingRow): ReportReading {
  return {
    sensorId: r.sensorId,
    atMs: r.at.getTime(),
    airC: r.airC,
    rhPct: r.rhPct,
    marginK: r.marginK,
    emcPct: r.emcPct,
    level: r.level,
  };
}

/** The figures of stored rows over [fromMs, endMs), gaps over ISO 9223's 15 min cap not counted. */
export function referenceWeekFigures(
  rows: readonly ReadingRow[],
  period: { fromMs: number; endMs: number },
): WeekFigures {
  return weekFiguresFromReadings(rows.map(toReportReading), {
    ...period,
    maxGapMs: TOW_MAX_GAP_MS,
  });
}

/**
 * The database's figures against the reference: counts, lowest margin and silent periods equal;
 * means and time sums within `within(want)` (only the order of float additions differs; 1e-9
 * unless a test says otherwise); min and max within it too, or equal with `exactMinMax`.
 */
export function expectSameWeekFigures(
  got: Omit<WeekFigures, 'periodMs' | 'annualWetHours'>,
  want: WeekFigures,
  options: { within?: (want: number) => number; exactMinMax?: boolean } = {},
) {
  const within = options.within ?? (() => 1e-9);
  const close = (a: number | null, b: number | null, what: string) => {
    if (b === null) expect(a, what).toBeNull();
    else expect(Math.abs(a! - b), `${what}: ${a} vs ${b}`).toBeLessThan(within(b));
  };
  expect(got.readings).toBe(want.readings);
  close(got.coveredMs, want.coveredMs, 'coveredMs');
  for (const key of ['airC', 'rhPct', 'emcPct'] as const) {
    for (const m of ['min', 'mean', 'max'] as const) {
      if (m !== 'mean' && options.exactMinMax)
        expect(got[key][m], `${key}.${m}`).toBe(want[key][m]);
      else close(got[key][m], want[key][m], `${key}.${m}`);
    }
  }
  expect(got.lowestMargin).toEqual(want.lowestMargin);
  for (const level of LEVELS) close(got.levelMs[level], want.levelMs[level], `levelMs.${level}`);
  close(got.wetnessMs, want.wetnessMs, 'wetnessMs');
  expect(got.silentPeriods).toEqual(want.silentPeriods);
}
