/**
 * Level hysteresis, so alarms do not flap on noisy sensors.
 *
 * A state machine over dew-margin samples: `(state, sample, options) → state`. Two rules:
 * - a new level is entered only after the samples have argued for it for `minCount` readings or
 *   for `minHoldMs`, whichever comes first;
 * - a level is left for a better one (wet → close → dry) only when the margin is past the limit
 *   plus `bandK`: wet is left above wetK + band, close for dry at cautionK + band. Moving to a worse
 *   level needs only the plain limit and the hold. That asymmetry is deliberate: the band delays
 *   the all-clear, never the warning, and one band is enough to stop chattering at a limit.
 * `unknown` (no surface data) is entered and left with the hold alone.
 *
 * When the samples in a run disagree (wet, close, wet while the state is dry), the run confirms the
 * level all of them support — here `close`, since every sample was at least that bad — rather than
 * restarting the count each time, which would let a noisy descent never raise anything. From
 * `unknown` there is no such order, and a mixed run confirms the worse level.
 *
 * The defaults are rules of thumb of ours, not from a standard: a band of 0.5 K matches the
 * ±0.5 K accuracy of a typical temperature sensor; three readings or five minutes ride out one
 * bad reading without delaying a real change by more than a few minutes.
 */
import { levelFor, levelSeverity, type Level, type MarginLimits } from './levels';

export interface HysteresisOptions {
  limits: MarginLimits;
  /** Extra margin, K, needed to leave a level for a better one. */
  bandK: number;
  /** A candidate level is entered after it has held this long... */
  minHoldMs: number;
  /** ...or for this many consecutive readings. */
  minCount: number;
}

export const DEFAULT_HYSTERESIS: Omit<HysteresisOptions, 'limits'> = {
  bandK: 0.5,
  minHoldMs: 5 * 60_000,
  minCount: 3,
};

export interface LevelSample {
  atMs: number;
  marginK: number | null;
}

export interface PendingLevel {
  level: Level;
  /** Time of the first reading of the run. */
  sinceMs: number;
  count: number;
}

export interface LevelState {
  level: Level;
  /** When the current level was entered (confirmed). */
  enteredAtMs: number;
  /** Time of the last reading taken into account. */
  atMs: number;
  pending: PendingLevel | null;
}

/** The level one sample argues for, given the current level and the band. */
export function targetLevel(
  current: Level,
  marginK: number | null,
  options: Pick<HysteresisOptions, 'limits' | 'bandK'>,
): Level {
  const raw = levelFor(marginK, options.limits);
  if (marginK === null || raw === 'unknown' || current === 'unknown') return raw;
  if (levelSeverity(raw) >= levelSeverity(current)) return raw;
  // Improving: judge the margin as if it were bandK smaller, but never worse than where we are.
  const banded = levelFor(marginK - options.bandK, options.limits);
  if (banded === 'unknown') return current;
  return levelSeverity(banded) > levelSeverity(current) ? current : banded;
}

/** The level a run keeps when a new sample argues for `next`; null when the run restarts. */
function mergeRun(current: Level, running: Level, next: Level): Level | null {
  if (running === 'unknown' || next === 'unknown') return running === next ? running : null;
  const r = levelSeverity(running);
  const n = levelSeverity(next);
  if (current === 'unknown') return r >= n ? running : next;
  const c = levelSeverity(current);
  if (r > c && n > c) return r <= n ? running : next;
  if (r < c && n < c) return r >= n ? running : next;
  return null;
}

/**
 * One step. A null state starts at `unknown`, so the first level is confirmed like any other.
 * Samples not later than the state (duplicates, out of order) or without a finite time leave it
 * unchanged.
 */
export function stepLevelHysteresis(
  state: LevelState,
  sample: LevelSample,
  options: HysteresisOptions,
): LevelState;
export function stepLevelHysteresis(
  state: LevelState | null,
  sample: LevelSample,
  options: HysteresisOptions,
): LevelState | null;
export function stepLevelHysteresis(
  state: LevelState | null,
  sample: LevelSample,
  options: HysteresisOptions,
): LevelState | null {
  if (!Number.isFinite(sample.atMs)) return state;
  if (state !== null && sample.atMs <= state.atMs) return state;
  const current: LevelState = state ?? {
    level: 'unknown',
    enteredAtMs: sample.atMs,
    atMs: sample.atMs,
    pending: null,
  };
  const target = targetLevel(current.level, sample.marginK, options);
  if (target === current.level) return { ...current, atMs: sample.atMs, pending: null };

  const merged = current.pending ? mergeRun(current.level, current.pending.level, target) : null;
  const pending: PendingLevel =
    current.pending && merged !== null
      ? { level: merged, sinceMs: current.pending.sinceMs, count: current.pending.count + 1 }
      : { level: target, sinceMs: sample.atMs, count: 1 };

  if (pending.count >= options.minCount || sample.atMs - pending.sinceMs >= options.minHoldMs) {
    return { level: pending.level, enteredAtMs: sample.atMs, atMs: sample.atMs, pending: null };
  }
  return { ...current, atMs: sample.atMs, pending };
}
