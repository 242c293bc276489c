/**
 * What a zone went through during a trial's test, from its stored readings: the week report's
 * aggregate (db/queries/reports.ts zoneWeekFigures, each reading standing until the zone's next,
 * capped at TOW_MAX_GAP_MS) run over the test's window instead of a week.
 */
import type { Db } from '@/db';
import { zoneWeekFigures } from '@/db/queries/reports';
import type { TrialTestRow } from '@/db/queries/trials';
import { TOW_MAX_GAP_MS } from '@/ingest/wetness';
import type { TrialTestConditions } from '@/ingest/wire';

const HOUR_MS = 3_600_000;

/** Conditions per test id, for tests with a zone; null where the window has no readings yet. */
export async function trialConditions(
  db: Db,
  tests: readonly TrialTestRow[],
  nowMs: number,
): Promise<Map<string, TrialTestConditions | null>> {
  const conditions = new Map<string, TrialTestConditions | null>();
  for (const test of tests) {
    if (!test.zoneId) continue;
    const fromMs = test.from.getTime();
    // A test still running counts up to now, as the week report does for the current week.
    const endMs = Math.min(test.to.getTime(), nowMs);
    if (endMs <= fromMs) {
      conditions.set(test.id, null);
      continue;
    }
    const figures = (
      await zoneWeekFigures(db, [test.zoneId], { fromMs, endMs, maxGapMs: TOW_MAX_GAP_MS })
    ).get(test.zoneId);
    conditions.set(
      test.id,
      figures
        ? {
            readings: figures.readings,
            lowestMarginK: figures.lowestMargin?.marginK ?? null,
            highestRhPct: figures.rhPct.max,
            hoursWet: figures.levelMs.wet / HOUR_MS,
            timeOfWetnessHours: figures.wetnessMs / HOUR_MS,
          }
        : null,
    );
  }
  return conditions;
}
