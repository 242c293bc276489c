/**
 * The moisture content a lumber zone should hold its wood at, and where a wood EMC sits against
 * it.
 *
 * Source: USDA Forest Products Laboratory, Wood Handbook — Wood as an Engineering Material
 * (FPL-GTR-190, 2010), chapter 13, the table of recommended moisture content values for various
 * wood items at time of installation (our brief calls it Table 13-1; a copy of the chapter's text
 * seen here gives 13-1 to the outdoor EMC of US cities, so check the number against the book).
 * Its interior-use rows, by the regions of the chapter's map:
 *
 *   most areas of the United States   average  8 %, individual pieces  6–10 %
 *   dry southwestern area             average  6 %, individual pieces  4–9 %
 *   damp, warm coastal areas          average 11 %, individual pieces  8–13 %
 *
 * These values are quoted FROM MEMORY, not read off the page while writing this; they match the
 * commonly cited figures (8 % for most of the US, 6 % in the dry southwest, 11 % on the humid
 * coasts). The band a zone is held to is the individual-pieces range, bounds included: lumber
 * stored in that air drifts towards the EMC, so an EMC inside the band keeps stock fit to use.
 */
import type { EmcRegion } from './wire/zones';

export interface EmcTargetBand {
  region: EmcRegion;
  /** The handbook's average for the region, % of oven-dry mass. */
  averagePct: number;
  /** The range for individual pieces, % of oven-dry mass, bounds in the band. */
  lowPct: number;
  highPct: number;
}

/** Wood Handbook 2010, ch. 13, recommended MC at installation, interior use (from memory). */
const BANDS: Record<EmcRegion, EmcTargetBand> = {
  most: { region: 'most', averagePct: 8, lowPct: 6, highPct: 10 },
  dry_southwest: { region: 'dry_southwest', averagePct: 6, lowPct: 4, highPct: 9 },
  damp_coastal: { region: 'damp_coastal', averagePct: 11, lowPct: 8, highPct: 13 },
};

export function emcTargetBand(region: EmcRegion): EmcTargetBand {
  return BANDS[region];
}

export type EmcBandPosition = 'below' | 'in' | 'above';

/**
 * Where an EMC sits against a band; null without a finite EMC (no reading yet, or a reading the
 * EMC equation could not take). The bounds belong to the band.
 */
export function emcBandPosition(
  emcPct: number | null | undefined,
  band: Pick<EmcTargetBand, 'lowPct' | 'highPct'>,
): EmcBandPosition | null {
  if (emcPct === null || emcPct === undefined || !Number.isFinite(emcPct)) return null;
  if (emcPct < band.lowPct) return 'below';
  if (emcPct > band.highPct) return 'above';
  return 'in';
}
