/**
 * Time of wetness and its ISO 9223 category.
 *
 * Definition (ISO 9223:1992, time of wetness; kept in ISO 9223:2012): the time during which
 * the relative humidity is above 80 % and the temperature above 0 °C. Both are strict: a reading
 * at exactly 80 % or exactly 0 °C is not wet.
 *
 * Accumulation: each reading stands for the interval until the next one (sample and hold), and
 * the last one until `endMs`; no interval counts for more than `maxGapMs`. Time beyond that cap is
 * a gap — neither wet nor dry — and is left out of `coveredMs`, so a silent sensor is not counted
 * as a dry shop and the yearly extrapolation is made from covered time only.
 *
 * Category: ISO 9223:1992, Table 1, by hours of wetness per year:
 *   τ1 ≤ 10 h, τ2 10…250 h, τ3 250…2500 h, τ4 2500…5500 h, τ5 > 5500 h
 * (each upper bound belongs to the lower category). Extrapolating a week to a year ignores the
 * seasons; the category of a short series is an indication, not a classification of the site.
 */

export const TOW_RH_ABOVE_PCT = 80;
export const TOW_AIR_ABOVE_C = 0;

/**
 * The longest interval one reading stands for in time of wetness and in the week report (hours
 * per level, means, coverage): 15 min, three of the slowest recommended posting interval (5 min,
 * ingest/postingInterval.ts) and the floor of a learnt silence. Longer than this is a gap. Our own
 * number, not a standard's.
 */
export const TOW_MAX_GAP_MS = 15 * 60 * 1000;

/** A common year (365 d). ISO 9223 states its categories per year without fixing the length. */
export const HOURS_PER_YEAR = 8760;

export function isWetIso9223(airC: number, rhPct: number): boolean {
  return rhPct > TOW_RH_ABOVE_PCT && airC > TOW_AIR_ABOVE_C;
}

export interface WetnessReading {
  atMs: number;
  airC: number;
  rhPct: number;
}

export interface TimeOfWetnessOptions {
  /** End of the period; the last reading holds until here (capped by `maxGapMs`). */
  endMs: number;
  /** Longest interval one reading may stand for. */
  maxGapMs: number;
}

export interface TimeOfWetness {
  wetMs: number;
  /** Time represented by readings, gaps excluded. */
  coveredMs: number;
}

/** Wet and covered time of a series; readings need not be sorted. */
export function timeOfWetness(
  readings: readonly WetnessReading[],
  options: TimeOfWetnessOptions,
): TimeOfWetness {
  const sorted = readings.filter((r) => Number.isFinite(r.atMs)).sort((a, b) => a.atMs - b.atMs);
  let wetMs = 0;
  let coveredMs = 0;
  for (let i = 0; i < sorted.length; i++) {
    const reading = sorted[i]!;
    const untilMs = Math.min(sorted[i + 1]?.atMs ?? options.endMs, options.endMs);
    const intervalMs = Math.min(Math.max(0, untilMs - reading.atMs), options.maxGapMs);
    // A reading without finite values says nothing about wetness: its interval is a gap.
    if (!Number.isFinite(reading.airC) || !Number.isFinite(reading.rhPct)) continue;
    coveredMs += intervalMs;
    if (isWetIso9223(reading.airC, reading.rhPct)) wetMs += intervalMs;
  }
  return { wetMs, coveredMs };
}

export type TowCategory = 't1' | 't2' | 't3' | 't4' | 't5';

/** ISO 9223:1992, Table 1: the category of an annual time of wetness in hours. */
export function towCategory(hoursPerYear: number): TowCategory {
  if (hoursPerYear <= 10) return 't1';
  if (hoursPerYear <= 250) return 't2';
  if (hoursPerYear <= 2500) return 't3';
  if (hoursPerYear <= 5500) return 't4';
  return 't5';
}

/** Wet hours per year at the series' wet fraction; null without covered time. */
export function annualWetHours(tow: TimeOfWetness): number | null {
  if (!(tow.coveredMs > 0)) return null;
  return (tow.wetMs / tow.coveredMs) * HOURS_PER_YEAR;
}

/** The ISO 9223 category of a series extrapolated to a year; null without covered time. */
export function annualTowCategory(tow: TimeOfWetness): TowCategory | null {
  const hours = annualWetHours(tow);
  return hours === null ? null : towCategory(hours);
}
