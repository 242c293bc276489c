/**
 * Where a reading becomes a margin: the contract's checks, then dew (or frost) point and EMC
 * from the air, then — once the surface is known, measured or estimated — the dew margin and
 * its level. Each value is computed once per reading, here, for the ingest route, the bench and
 * the app's previews alike.
 *
 * The level is decided when the reading is stored, with the zone's limits in force at that
 * moment, and stored beside it. Everything that shows or counts a stored reading's level (chart,
 * alarms, reports) uses that stored level; changing a zone's limits applies to readings from then
 * on and never rewrites history.
 */
import { emcPct } from './emc';
import { DEFAULT_LIMITS, dewMarginK, levelFor, type Level, type MarginLimits } from './levels';
import { checkReading, type Rejection, type SensorReading } from './payload';
import { dewPoint } from './psychrometrics';

/** What the air alone gives: known before the surface is, so it is the first step. */
export interface AirDerived {
  dewPointC: number;
  emcPct: number | null;
}

export interface Derived {
  dewPointC: number | null;
  marginK: number | null;
  emcPct: number | null;
  level: Level;
}

export type AirVerdict = { ok: true; air: AirDerived } | { ok: false; rejection: Rejection };

/**
 * The per-reading checks and the air's derived values in one step: a reading that fails a
 * check, or whose dew point cannot be computed, comes back as the rejection to list.
 */
export function deriveAir(reading: SensorReading, nowMs: number): AirVerdict {
  const problem = checkReading(reading, nowMs);
  if (problem) return { ok: false, rejection: problem };
  const dew = dewPoint(reading.airC, reading.rhPct);
  if (!dew.ok) {
    return {
      ok: false,
      rejection: {
        code: 'not_computable',
        message: 'The dew point cannot be computed from this reading (RH below 0.5 %?).',
      },
    };
  }
  return {
    ok: true,
    air: { dewPointC: dew.dewPointC, emcPct: emcPct(reading.airC, reading.rhPct) },
  };
}

/** The second step: the surface (probe or estimate, or none) against the air's dew point. */
export function deriveMargin(
  air: AirDerived,
  surfaceC: number | null,
  limits: MarginLimits = DEFAULT_LIMITS,
): Derived {
  const marginK = dewMarginK(surfaceC, air.dewPointC);
  return {
    dewPointC: air.dewPointC,
    marginK,
    emcPct: air.emcPct,
    level: levelFor(marginK, limits),
  };
}

export interface DeriveInput {
  airC: number;
  rhPct: number;
  surfaceC: number | null;
}

/** Both steps for values already checked (the bench, previews): unknown when not computable. */
export function deriveReading(input: DeriveInput, limits: MarginLimits = DEFAULT_LIMITS): Derived {
  const dew = dewPoint(input.airC, input.rhPct);
  if (!dew.ok) return { dewPointC: null, marginK: null, emcPct: null, level: 'unknown' };
  const air = { dewPointC: dew.dewPointC, emcPct: emcPct(input.airC, input.rhPct) };
  return deriveMargin(air, input.surfaceC, limits);
}
