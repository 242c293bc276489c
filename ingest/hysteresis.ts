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
 * restarting the count each time. From `unknown` there is no such order, and a mixed run confirms
 * the worse level. A run also survives one contrary reading at a time (it is not counted); two in
 * a row end it. Without that, a margin hovering at a limit (0.9, 1.1, 0.8, 1.2, …) would never
 * confirm the worse level, and a rust alarm must not be talked out of itself by noise.
 *
 * The defaults are rules of thumb of ours, not from a standard: a band of 0.5 K matches the
 * ±0.5 K accuracy of a typical temperature sensor; three readings or five minutes ride out a
 * bad reading without delaying a real change by more than a few minutes.
 */
import { levelFor, levelSeverity, type Level, type MarginLimits } from './levels';

export interface HysteresisOptions {
  limits: MarginLimits;
  /** Extra margin, K, needed to leave a level for a better one. */
  bandK: number;
  /** A candidate level is entered after it has held this long... */
  minHoldMs: number;
  /** ...or for this many readings of the run. */
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
  /** Readings that supported the run. */
  count: number;
  /** Contrary readings since the last supporting one (0 or 1; the second ends the run). */
  contrary: number;
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
  const run = current.pending;
  const merged =
    run === null || target === current.level ? null : mergeRun(current.level, run.level, target);

  if (run !== null && merged === null && run.contrary === 0) {
    // The first contrary reading: the run waits for the next one.
    return { ...current, atMs: sample.atMs, pending: { ...run, contrary: 1 } };
  }
  if (target === current.level) return { ...current, atMs: sample.atMs, pending: null };

  const pending: PendingLevel =
    run !== null && merged !== null
      ? { level: merged, sinceMs: run.sinceMs, count: run.count + 1, contrary: 0 }
      : { level: target, sinceMs: sample.atMs, count: 1, contrary: 0 };

  if (pending.count >= options.minCount || sample.atMs - pending.sinceMs >= options.minHoldMs) {
    return { level: pending.level, enteredAtMs: sample.atMs, atMs: sample.atMs, pending: null };
  }
  return { ...current, atMs: sample.atMs, pending };
}
