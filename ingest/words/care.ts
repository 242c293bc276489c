/**
 * The care log's words: coating types, the ISO 4628-3 rusting grades, and the re-coat
 * suggestion with its cautions. The same words serve the app, the files and the mail.
 */
import type { RecoatCause } from '../care';
import type { CoatingType, RustingGrade } from '../wire/surfaces';

import { CAUTIONS } from './advice';

/** Generic names of our own; a shop writes the product it used as free text beside them. */
export const COATING_TYPE_LABELS: Record<CoatingType, string> = {
  wax: 'Paste wax',
  dry_film: 'Dry-film lubricant',
  inhibitor_spray: 'Corrosion-inhibitor spray',
  oil: 'Oil',
  other: 'Other coat',
};

export const RUSTING_STANDARD = 'ISO 4628-3';

/**
 * The degree of rusting, Ri 0 to Ri 5, in our own words. ISO 4628-3 defines each grade by the
 * rusted share of the area, with pictorial references; the percentages here are quoted from
 * memory (Ri 1 about 0.05 %, Ri 2 about 0.5 %, Ri 3 about 1 %, Ri 4 about 8 %, Ri 5 40–50 %):
 * check the standard before relying on them.
 */
export const RUSTING_GRADE_WORDS: Record<RustingGrade, string> = {
  0: 'Ri 0 — no rust to be seen',
  1: 'Ri 1 — a few pinpoints of rust (about 0.05 % of the area)',
  2: 'Ri 2 — scattered specks of rust (about 0.5 % of the area)',
  3: 'Ri 3 — rust spots easy to see (about 1 % of the area)',
  4: 'Ri 4 — patches of rust (about 8 % of the area)',
  5: 'Ri 5 — rust over much of the surface (about 40–50 % of the area)',
};

/** Where the fire-code deference lives for the care log: oily rags are a fire hazard. */
export const RECOAT_CAUTIONS: readonly string[] = [
  CAUTIONS.unplug,
  CAUTIONS.coatingLabel,
  CAUTIONS.ventilate,
  CAUTIONS.oilyRags,
  'Follow the coating maker’s instructions and your local fire codes; they come before this advice.',
];

const hours = (h: number) => `${h.toFixed(1)} h`;

export interface RecoatWordsInput {
  cause: RecoatCause;
  coating: CoatingType | null;
  exposure: { hoursWet: number; hoursClose: number; towHours: number } | null;
  budget: { hoursWet: number; hoursClose: number; towHours: number };
}

/** One sentence saying whether a re-coat is suggested and why. */
export function recoatReason({ cause, coating, exposure, budget }: RecoatWordsInput): string {
  const coat = coating ? COATING_TYPE_LABELS[coating].toLowerCase() : 'coat';
  // Every cause but no_coat comes with an exposure; zeros keep the sentence whole regardless.
  const e = exposure ?? { hoursWet: 0, hoursClose: 0, towHours: 0 };
  switch (cause) {
    case 'no_coat':
      return 'No coat is logged for this surface yet: coat it and log the coat.';
    case 'wet':
      return `Re-coat suggested: wet for ${hours(e.hoursWet)} since the ${coat}, more than its budget of ${hours(budget.hoursWet)}.`;
    case 'close':
      return `Re-coat suggested: close to the dew point for ${hours(e.hoursClose)} since the ${coat}, more than its budget of ${hours(budget.hoursClose)}.`;
    case 'tow':
      return `Re-coat suggested: ${hours(e.towHours)} of time of wetness (ISO 9223) since the ${coat}, more than its budget of ${hours(budget.towHours)}.`;
    case 'none':
      return `The ${coat} is within its budget: wet ${hours(e.hoursWet)} of ${hours(budget.hoursWet)}, close ${hours(e.hoursClose)} of ${hours(budget.hoursClose)}, time of wetness ${hours(e.towHours)} of ${hours(budget.towHours)}.`;
  }
}

export const CARE_KIND_WORDS: Record<'coating' | 'inspection', string> = {
  coating: 'Coat',
  inspection: 'Inspection',
};

/** A surface's standing against its coat's budget, as a word beside (never instead of) colour. */
export const RECOAT_STATE_WORDS = {
  due: 'Re-coat due',
  ok: 'Within budget',
  none: 'No coat logged',
} as const;

export const EXPOSURE_WORDS = {
  hoursClose: 'Close to the dew point',
  hoursWet: 'Wet',
  tow: 'Time of wetness (ISO 9223)',
  since: 'Since the last coat',
} as const;

/** Said wherever the budgets are shown: the defaults are ours, not a standard's. */
export const BUDGET_WORDS = {
  intro:
    'How much exposure a coat takes before Drybench suggests a re-coat. A surface is due when any one budget is passed.',
  ruleOfThumb:
    'Default: a rule of thumb of the trade with no published source. Change it once your own inspections say otherwise.',
  own: 'Set by this shop.',
  fields: { hoursWet: 'Wet (h)', hoursClose: 'Close (h)', towHours: 'Time of wetness (h)' },
} as const;

/** Where a surface's temperature comes from, for its page. */
export const SURFACE_SOURCE_WORDS = {
  probe: (sensorName: string) => `Probe on the surface: ${sensorName}`,
  estimate: 'No probe: the zone’s sensors, with the surface estimated from the air where needed',
} as const;
