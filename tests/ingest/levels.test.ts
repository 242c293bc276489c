import { describe, expect, it } from 'vitest';

import {
  DEFAULT_LIMITS,
  dewMarginK,
  levelFor,
  marginLimitsSchema,
  type Level,
} from '../../ingest/levels';

describe('levels at their limits', () => {
  // Caution limit 3 K: ISO 8502-4 (steel at least 3 K above the dew point before coating).
  // Wet limit 1 K: a rule of thumb of the trade (two sensors of ±0.5 K), no published source.
  it.each<[number | null, Level]>([
    [10, 'dry'],
    [3, 'dry'], // exactly at the caution limit counts as dry (ISO 8502-4 says "at least 3 K")
    [2.999, 'close'],
    [1.001, 'close'],
    [1, 'wet'], // exactly at the wet limit counts as wet
    [0, 'wet'],
    [-4, 'wet'],
    [null, 'unknown'],
    [Number.NaN, 'unknown'],
  ])('margin %s K with default limits → %s', (marginK, level) => {
    expect(levelFor(marginK, DEFAULT_LIMITS)).toBe(level);
  });

  it.each<[number, Level]>([
    [5, 'dry'],
    [4.99, 'close'],
    [2.01, 'close'],
    [2, 'wet'],
  ])('margin %d K with a zone set to caution 5 K / wet 2 K → %s', (marginK, level) => {
    expect(levelFor(marginK, { cautionK: 5, wetK: 2 })).toBe(level);
  });
});

describe('dew margin', () => {
  it('is surface minus dew point in kelvin, null without a surface', () => {
    expect(dewMarginK(12.5, 9.25)).toBeCloseTo(3.25, 12);
    expect(dewMarginK(-3, -1)).toBeCloseTo(-2, 12);
    expect(dewMarginK(null, 9)).toBeNull();
    expect(dewMarginK(12, null)).toBeNull();
  });
});

describe('zone limits schema', () => {
  it('accepts the defaults and refuses a wet limit at or above the caution limit', () => {
    expect(marginLimitsSchema.safeParse(DEFAULT_LIMITS).success).toBe(true);
    expect(marginLimitsSchema.safeParse({ cautionK: 2, wetK: 2 }).success).toBe(false);
    expect(marginLimitsSchema.safeParse({ cautionK: 2, wetK: 3 }).success).toBe(false);
  });
});
