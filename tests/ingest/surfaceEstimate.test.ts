import { describe, expect, it } from 'vitest';

import {
  DEFAULT_SURFACE_TAU_S,
  estimateSurfaceSeries,
  stepSurfaceEstimate,
  type SurfaceEstimateState,
} from '../../ingest/surfaceEstimate';

const MINUTE_MS = 60_000;
const HOUR_MS = 60 * MINUTE_MS;
const T0_MS = Date.UTC(2026, 0, 15, 6, 0, 0);

/** A surface settled at `surfaceC` in air at the same temperature, at T0. */
function settledAt(surfaceC: number): SurfaceEstimateState {
  return { atMs: T0_MS, surfaceC, airC: surfaceC, startedAtMs: T0_MS, source: 'estimate' };
}

/** Run the lag over readings of constant air temperature at the given offsets from T0. */
function stepResponse(fromC: number, toC: number, offsetsMs: number[], tauS: number) {
  let state = settledAt(fromC);
  for (const offsetMs of offsetsMs) {
    state = stepSurfaceEstimate(
      state,
      { atMs: T0_MS + offsetMs, airC: toC },
      {
        tauS,
        maxGapMs: 6 * HOUR_MS,
      },
    );
  }
  return state;
}

describe('step response of the first-order lag', () => {
  // Analytic step response of a first-order lag (any control or heat-transfer text):
  // Ts(t) = Ta + (Ts0 − Ta)·exp(−t/τ); after τ it has covered 1 − e⁻¹ = 63.2 % of the step, after
  // 3τ 95.0 %. The update is exact for air held over each interval, so irregular steps must land
  // on the curve; allowed error 1e-9 K, floating-point rounding only.
  const tauS = 3 * 3600;
  const irregularToTauMs = [
    41_000,
    7 * MINUTE_MS,
    23 * MINUTE_MS,
    1 * HOUR_MS + 2_500,
    3 * HOUR_MS,
  ];

  it('covers 63.2 % of a 10 K warm-up after τ, over irregular intervals', () => {
    const state = stepResponse(10, 20, irregularToTauMs, tauS);
    expect(state.surfaceC).toBeCloseTo(10 + 10 * (1 - Math.exp(-1)), 9);
    expect(state.surfaceC).toBeCloseTo(16.321, 3); // 63.2 % of the step
    expect(state.source).toBe('estimate');
  });

  it('covers 95.0 % after 3τ and matches the curve at every irregular reading', () => {
    const offsetsMs = [...irregularToTauMs, 4 * HOUR_MS + 17 * MINUTE_MS, 9 * HOUR_MS];
    let state = settledAt(10);
    for (const offsetMs of offsetsMs) {
      state = stepSurfaceEstimate(
        state,
        { atMs: T0_MS + offsetMs, airC: 20 },
        {
          tauS,
          maxGapMs: 6 * HOUR_MS,
        },
      );
      const expected = 20 - 10 * Math.exp(-offsetMs / 1000 / tauS);
      expect(state.surfaceC).toBeCloseTo(expected, 9);
    }
    expect((state.surfaceC - 10) / 10).toBeCloseTo(0.9502, 4);
  });

  it('cools the same way (the lag is symmetric) and scales with τ', () => {
    const state = stepResponse(15, 5, [10 * MINUTE_MS, 25 * MINUTE_MS, 30 * MINUTE_MS], 1800);
    expect(state.surfaceC).toBeCloseTo(5 + 10 * Math.exp(-1), 9);
  });

  it('does not depend on how an interval is split', () => {
    const one = stepResponse(0, 12, [2 * HOUR_MS], tauS);
    const many = stepResponse(
      0,
      12,
      [1, 2, 3, 60, 119].map((m) => m * MINUTE_MS).concat([2 * HOUR_MS]),
      tauS,
    );
    expect(many.surfaceC).toBeCloseTo(one.surfaceC, 9);
  });
});

describe('gaps, order and bad input', () => {
  const options = { tauS: 3 * 3600, maxGapMs: 2 * HOUR_MS };

  it('starts at the air temperature with no state', () => {
    const state = stepSurfaceEstimate(null, { atMs: T0_MS, airC: 7.5 }, options);
    expect(state).toEqual({
      atMs: T0_MS,
      surfaceC: 7.5,
      airC: 7.5,
      startedAtMs: T0_MS,
      source: 'estimate',
    });
  });

  it.each([
    [2 * HOUR_MS, false], // exactly the limit is still bridged
    [2 * HOUR_MS + 1, true],
  ])('after a gap of %d ms restarts: %s', (gapMs, restarts) => {
    const state = stepSurfaceEstimate(settledAt(0), { atMs: T0_MS + gapMs, airC: 10 }, options);
    if (restarts) {
      expect(state.surfaceC).toBe(10);
      expect(state.startedAtMs).toBe(T0_MS + gapMs);
    } else {
      expect(state.surfaceC).toBeCloseTo(10 - 10 * Math.exp(-2 / 3), 9);
      expect(state.startedAtMs).toBe(T0_MS);
    }
  });

  it.each([
    ['a duplicate time', T0_MS, 20],
    ['an earlier time', T0_MS - MINUTE_MS, 20],
    ['a non-finite air temperature', T0_MS + MINUTE_MS, Number.NaN],
  ])('leaves the state unchanged for %s', (_label, atMs, airC) => {
    const state = settledAt(3);
    expect(stepSurfaceEstimate(state, { atMs, airC }, options)).toBe(state);
  });

  it('refuses a non-positive τ', () => {
    expect(() =>
      stepSurfaceEstimate(null, { atMs: T0_MS, airC: 1 }, { tauS: 0, maxGapMs: 1 }),
    ).toThrow(RangeError);
  });

  it('rebuilds the same state from a stored series as step by step', () => {
    const samples = [0, 5, 12, 30, 200, 205].map((m, i) => ({
      atMs: T0_MS + m * MINUTE_MS,
      airC: 4 + i,
    }));
    const series = estimateSurfaceSeries(samples, options);
    let state: SurfaceEstimateState | null = null;
    for (const sample of samples) state = stepSurfaceEstimate(state, sample, options);
    expect(series.at(-1)).toEqual(state);
    // The 170 min silence between minute 30 and 200 exceeds 2 h: the estimate restarted there.
    expect(series.at(-1)?.startedAtMs).toBe(T0_MS + 200 * MINUTE_MS);
  });
});

describe('default time constant', () => {
  it('matches the lumped estimate stated in surfaceEstimate.ts within 10 %', () => {
    // ρ·c·L / h from the comment's numbers: 7200 kg/m³ · 460 J/(kg·K) · 0.016 m / 4.5 W/(m²·K).
    const lumpedS = (7200 * 460 * 0.016) / 4.5;
    expect(Math.abs(DEFAULT_SURFACE_TAU_S / lumpedS - 1)).toBeLessThanOrEqual(0.1);
  });
});
