import { describe, expect, it } from 'vitest';

import {
  DEFAULT_HYSTERESIS,
  stepLevelHysteresis,
  targetLevel,
  type HysteresisOptions,
  type LevelState,
} from '../../ingest/hysteresis';
import { DEFAULT_LIMITS, levelFor, type Level } from '../../ingest/levels';

// The hysteresis rules are ours (issue 3), not from a standard; these tests pin the behaviour
// the alarm engine relies on. Limits: 3 K caution (ISO 8502-4), 1 K wet (rule of thumb).
const MINUTE_MS = 60_000;
const T0_MS = Date.UTC(2026, 2, 2, 6, 0, 0);
const options: HysteresisOptions = { limits: DEFAULT_LIMITS, ...DEFAULT_HYSTERESIS };

/** Feed margins one minute apart (or at the given spacing) and return every state. */
function run(margins: (number | null)[], start: LevelState | null, spacingMs = MINUTE_MS) {
  const states: LevelState[] = [];
  let state = start;
  margins.forEach((marginK, i) => {
    state = stepLevelHysteresis(state, { atMs: T0_MS + (i + 1) * spacingMs, marginK }, options);
    if (state) states.push(state);
  });
  return states;
}

function settled(level: Level): LevelState {
  return { level, enteredAtMs: T0_MS - 60 * MINUTE_MS, atMs: T0_MS, pending: null };
}

function changes(levels: Level[]): number {
  return levels.filter((level, i) => i > 0 && level !== levels[i - 1]).length;
}

describe('flapping', () => {
  it('changes once, to the worse level, on a margin that wobbles across the caution limit', () => {
    const margins = Array.from({ length: 30 }, (_, i) => (i % 2 === 0 ? 2.9 : 3.1));
    const levels = run(margins, settled('dry')).map((s) => s.level);
    expect(changes(margins.map((m) => levelFor(m, DEFAULT_LIMITS)))).toBe(29); // raw levels flap
    expect(changes(['dry', ...levels])).toBe(1);
    expect(levels.at(-1)).toBe('close'); // 3.1 K is not past 3 K + 0.5 K band, so close stays
  });

  it('is not moved by one stray reading', () => {
    const levels = run([5, 5, 0.2, 5, 5, 5], settled('dry')).map((s) => s.level);
    expect(changes(['dry', ...levels])).toBe(0);
  });

  it('ends a run after two contrary readings in a row', () => {
    // wet, dry, dry, wet, wet: the two dry readings end the first run, so the count restarts.
    const levels = run([0.5, 5, 5, 0.5, 0.5], settled('dry')).map((s) => s.level);
    expect(levels).toEqual(['dry', 'dry', 'dry', 'dry', 'dry']);
  });

  it('enters wet once on a noisy descent and stays until clearly clear', () => {
    const margins = [1.2, 0.9, 1.1, 0.8, 0.9, 1.2, 1.4, 1.3, 1.45, 1.2];
    const levels = run(margins, settled('close')).map((s) => s.level);
    expect(levels.at(-1)).toBe('wet');
    expect(changes(['close', ...levels])).toBe(1);
  });
});

describe('entering a level: minimum count or minimum time', () => {
  it('needs three readings at one-minute spacing', () => {
    const levels = run([2, 2, 2], settled('dry')).map((s) => s.level);
    expect(levels).toEqual(['dry', 'dry', 'close']);
  });

  it('needs five minutes when readings are sparse', () => {
    const levels = run([2, 2], settled('dry'), 10 * MINUTE_MS).map((s) => s.level);
    expect(levels).toEqual(['dry', 'close']);
  });

  it('confirms the level a mixed run supports (wet, close, wet from dry → close)', () => {
    const states = run([0.5, 2, 0.5], settled('dry'));
    expect(states.map((s) => s.level)).toEqual(['dry', 'dry', 'close']);
    expect(states.at(-1)?.enteredAtMs).toBe(T0_MS + 3 * MINUTE_MS);
  });

  it('starts at unknown and confirms the first level like any other', () => {
    const levels = run([5, 5, 5], null).map((s) => s.level);
    expect(levels).toEqual(['unknown', 'unknown', 'dry']);
  });

  it('goes to unknown when surface data stop', () => {
    expect(run([null, null, null], settled('close')).at(-1)?.level).toBe('unknown');
  });
});

describe('leaving a level needs the band, moving to a worse one does not', () => {
  it.each<[Level, number, Level]>([
    ['wet', 1.5, 'wet'], // wet limit + band, not past it
    ['wet', 1.51, 'close'],
    ['wet', 3.6, 'dry'],
    ['close', 3.49, 'close'],
    ['close', 3.5, 'dry'], // caution limit + band reached
    ['close', 1, 'wet'], // worse: plain limit
    ['dry', 2.99, 'close'], // worse: plain limit
    ['dry', 0.2, 'wet'],
  ])('from %s at %d K the target is %s', (current, marginK, target) => {
    expect(targetLevel(current, marginK, options)).toBe(target);
  });

  it('holds leaving as well as entering', () => {
    const levels = run([1.8, 1.8, 1.8], settled('wet')).map((s) => s.level);
    expect(levels).toEqual(['wet', 'wet', 'close']);
  });
});

describe('replay safety', () => {
  it('ignores duplicate and earlier readings', () => {
    const state = settled('dry');
    expect(stepLevelHysteresis(state, { atMs: T0_MS, marginK: 0 }, options)).toBe(state);
    expect(stepLevelHysteresis(state, { atMs: T0_MS - 1, marginK: 0 }, options)).toBe(state);
  });
});
