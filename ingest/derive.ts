/**
 * Everything we derive from one reading: dew (or frost) point, dew margin, EMC and level.
 * Used by the ingest route to store derived columns and by the app to preview values.
 */
import { emcPct } from './emc';
import { DEFAULT_LIMITS, levelFor, type Level, type MarginLimits } from './levels';
import { dewPoint } from './psychrometrics';

export interface DeriveInput {
  airC: number;
  rhPct: number;
  surfaceC: number | null;
}

export interface Derived {
  dewPointC: number | null;
  marginK: number | null;
  emcPct: number | null;
  level: Level;
}

export function deriveReading(input: DeriveInput, limits: MarginLimits = DEFAULT_LIMITS): Derived {
  const dew = dewPoint(input.airC, input.rhPct);
  if (!dew.ok) return { dewPointC: null, marginK: null, emcPct: null, level: 'unknown' };
  const marginK = input.surfaceC === null ? null : input.surfaceC - dew.dewPointC;
  return {
    dewPointC: dew.dewPointC,
    marginK,
    emcPct: emcPct(input.airC, input.rhPct),
    level: levelFor(marginK, limits),
  };
}
