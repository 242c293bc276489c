/**
 * When a protective coat on cast iron has taken enough damp to be renewed: the exposure since
 * the coat (hours at the close and wet levels, ISO 9223 time of wetness) against a budget per
 * coating type. Pure: the hours come from the stored readings (db/queries/reports.ts).
 */
import type { CoatingType } from './wire/surfaces';

export interface CoatingBudgetHours {
  hoursWet: number;
  hoursClose: number;
  towHours: number;
}

/**
 * Default budgets. Rules of thumb of the trade with no published source: our own numbers, set
 * so that a thin paste wax is renewed first and a dedicated inhibitor last. A shop changes them
 * (PUT …/coating-budgets) once its own inspections say otherwise. Condensation (wet) wears a coat
 * far faster than hours near the dew point (close), hence the small wet budgets.
 */
export const DEFAULT_COATING_BUDGETS: Record<CoatingType, CoatingBudgetHours> = {
  wax: { hoursWet: 4, hoursClose: 72, towHours: 500 },
  dry_film: { hoursWet: 8, hoursClose: 120, towHours: 800 },
  inhibitor_spray: { hoursWet: 12, hoursClose: 240, towHours: 1500 },
  oil: { hoursWet: 6, hoursClose: 96, towHours: 700 },
  other: { hoursWet: 4, hoursClose: 72, towHours: 500 },
};

export interface ExposureHours {
  hoursWet: number;
  hoursClose: number;
  towHours: number;
}

/** Which budget an exposure has passed first in order of harm (wet, then close, then wetness). */
export type RecoatCause = 'none' | 'no_coat' | 'wet' | 'close' | 'tow';

/** A budget is passed when the exposure is strictly above it; exactly at the budget is not yet. */
export function recoatCause(
  exposure: ExposureHours | null,
  budget: CoatingBudgetHours,
): RecoatCause {
  if (!exposure) return 'no_coat';
  if (exposure.hoursWet > budget.hoursWet) return 'wet';
  if (exposure.hoursClose > budget.hoursClose) return 'close';
  if (exposure.towHours > budget.towHours) return 'tow';
  return 'none';
}
