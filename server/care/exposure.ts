/**
 * A surface's exposure since its last coat, with the week report's aggregates (each reading
 * stands until the next, at most TOW_MAX_GAP_MS), and whether a re-coat is due by the coat's
 * budget.
 */
import type { Db } from '@/db';
import { zoneWeekFigures } from '@/db/queries/reports';
import { lastCoating, listCoatingBudgets, type SurfaceRow } from '@/db/queries/surfaces';
import { DEFAULT_COATING_BUDGETS, recoatCause, type ExposureHours } from '@/ingest/care';
import { TOW_MAX_GAP_MS } from '@/ingest/wetness';
import type { SurfaceExposure } from '@/ingest/wire/surfaces';
import { RECOAT_CAUTIONS, recoatReason } from '@/ingest/words/care';

import { toCoatingBudgets } from '../wire/surfaces';

const HOUR_MS = 3_600_000;

export async function surfaceExposure(
  db: Db,
  shopId: string,
  surface: SurfaceRow,
  nowMs: number,
): Promise<SurfaceExposure> {
  const [coat, budgetRows] = await Promise.all([
    lastCoating(db, shopId, surface.id),
    listCoatingBudgets(db, shopId),
  ]);
  // Without a coat there is nothing to measure against; the generic budget fills the slot.
  const type = coat?.coatingType ?? 'other';
  const budget =
    toCoatingBudgets(budgetRows).find((b) => b.coating === type) ?? DEFAULT_COATING_BUDGETS[type];

  let exposure: ExposureHours | null = null;
  if (coat) {
    // A coat logged a little ahead of the clock (the 5 minutes a body may run ahead) has no
    // exposure yet: the period is empty rather than negative.
    const fromMs = coat.at.getTime();
    const endMs = Math.max(fromMs, nowMs);
    const figures = await zoneWeekFigures(db, [surface.zoneId], {
      fromMs,
      endMs,
      maxGapMs: TOW_MAX_GAP_MS,
      sensorId: surface.sensorId ?? undefined,
    });
    const f = figures.get(surface.zoneId);
    exposure = {
      hoursWet: f ? f.levelMs.wet / HOUR_MS : 0,
      hoursClose: f ? f.levelMs.close / HOUR_MS : 0,
      towHours: f ? f.wetnessMs / HOUR_MS : 0,
    };
  }
  const cause = recoatCause(exposure, budget);
  const due = cause !== 'none';
  return {
    since: coat ? coat.at.toISOString() : null,
    coating: coat?.coatingType ?? null,
    hoursClose: exposure?.hoursClose ?? null,
    hoursWet: exposure?.hoursWet ?? null,
    timeOfWetnessHours: exposure?.towHours ?? null,
    recoat: {
      due,
      reason: recoatReason({ cause, coating: coat?.coatingType ?? null, exposure, budget }),
      cautions: due ? [...RECOAT_CAUTIONS] : [],
    },
  };
}
