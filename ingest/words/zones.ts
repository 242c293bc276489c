/**
 * Words about what a zone holds and its wood target band: the purposes, the Wood Handbook's
 * regions, the table the band comes from, and where an EMC sits against the band.
 */
import type { EmcBandPosition, EmcTargetBand } from '../emcTarget';
import type { EmcRegion, ZonePurpose } from '../wire/zones';

export const PURPOSE_WORDS: Record<ZonePurpose, string> = {
  machines: 'Machines',
  lumber: 'Lumber',
  finishing: 'Finishing',
  general: 'General',
};

/** The handbook's regions for interior wood, as people read them. */
export const EMC_REGION_WORDS: Record<EmcRegion, string> = {
  most: 'Most of the US',
  dry_southwest: 'Dry southwest',
  damp_coastal: 'Damp, warm coast',
};

/** The table a band comes from, shown in small print beside it. */
export const EMC_TARGET_SOURCE =
  'Wood Handbook (USDA Forest Products Laboratory, 2010), ch. 13: recommended moisture content of interior wood at installation';

/** "6–10 %" */
export function bandRange(band: Pick<EmcTargetBand, 'lowPct' | 'highPct'>): string {
  return `${band.lowPct}–${band.highPct} %`;
}

/** "Above the target band", "In the target band", "Below the target band". */
export const EMC_POSITION_WORDS: Record<EmcBandPosition, string> = {
  below: 'Below the target band',
  in: 'In the target band',
  above: 'Above the target band',
};
