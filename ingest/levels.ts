/**
 * Dew margin and its level.
 *
 * The margin is surface temperature minus dew point (frost point below 0 °C), in kelvin. The
 * caution limit's default of 3 K follows ISO 8502-4, which asks for a steel surface at least 3 K
 * above the dew point before coating. The wet limit's default of 1 K is a rule of thumb of the
 * trade with no published source: surface and air sensors are each good to about ±0.5 K, so a
 * margin under 1 K cannot be told from condensation. Both limits are set per zone.
 *
 * Edges: a margin exactly at the caution limit is `dry`, exactly at the wet limit is `wet`.
 */
import { z } from 'zod';

import type { Level } from './wire/levels';

// The list itself lives with the wire shapes, which the app imports without zod.
export { LEVELS, type Level } from './wire/levels';

export interface MarginLimits {
  cautionK: number;
  wetK: number;
}

export const DEFAULT_LIMITS: MarginLimits = { cautionK: 3, wetK: 1 };

/** Zone limits as configured by an owner: the wet limit must sit below the caution limit. */
export const marginLimitsSchema = z
  .object({ cautionK: z.number().finite(), wetK: z.number().finite() })
  .refine((limits) => limits.wetK < limits.cautionK, {
    message: 'The wet limit must be below the caution limit.',
    path: ['wetK'],
  });

/** Surface minus dew (or frost) point, K; null when either is missing. */
export function dewMarginK(surfaceC: number | null, dewPointC: number | null): number | null {
  if (surfaceC === null || dewPointC === null) return null;
  const marginK = surfaceC - dewPointC;
  return Number.isFinite(marginK) ? marginK : null;
}

export function levelFor(marginK: number | null, limits: MarginLimits = DEFAULT_LIMITS): Level {
  if (marginK === null || !Number.isFinite(marginK)) return 'unknown';
  if (marginK <= limits.wetK) return 'wet';
  if (marginK >= limits.cautionK) return 'dry';
  return 'close';
}

/** How bad a known level is: dry 0, close 1, wet 2 (unknown has no place on this scale). */
export function levelSeverity(level: Exclude<Level, 'unknown'>): number {
  return level === 'wet' ? 2 : level === 'close' ? 1 : 0;
}
