import { describe, expect, it } from 'vitest';

import { fitMarginTrend, minutesToWet, theilSen, type MarginSample } from '../../ingest/trend';

const MINUTE_MS = 60_000;
const NOW_MS = Date.UTC(2026, 2, 2, 7, 30, 0);

/** Margin samples on a straight line `marginNowK + slopeKPerMin · minutes` (minutes ≤ 0). */
function line(marginNowK: number, slopeKPerMin: number, minutesAgo: number[]): MarginSample[] {
  return minutesAgo.map((m) => ({
    atMs: NOW_MS - m * MINUTE_MS,
    marginK: marginNowK - slopeKPerMin * m,
  }));
}

describe('Theil–Sen fit', () => {
  it('matches a worked example by hand', () => {
    // Points (1,1) (2,2) (3,3.5) (4,4). Pair slopes: 1, 1.25, 1, 1.5, 1, 0.5 → median 1.
    // Offsets y − x: 0, 0, 0.5, 0 → median 0. (Sen 1968: slope median, intercept median.)
    expect(theilSen([1, 2, 3, 4], [1, 2, 3.5, 4])).toEqual({ slope: 1, intercept: 0 });
  });

  it('has no slope without two distinct times', () => {
    expect(theilSen([5, 5, 5], [1, 2, 3])).toBeNull();
  });

  // The definition (Sen 1968): sort every pair slope (pairs with equal x skipped) and every
  // offset yᵢ − slope·xᵢ, take the middle value or the mean of the middle two. The fit finds its
  // medians by selection, not sorting; it must give exactly these values, ties, repeated times
  // and odd and even counts included.
  function bySorting(xs: number[], ys: number[]) {
    const slopes: number[] = [];
    for (let i = 0; i < xs.length; i++)
      for (let j = i + 1; j < xs.length; j++)
        if (xs[j] !== xs[i]) slopes.push((ys[j]! - ys[i]!) / (xs[j]! - xs[i]!));
    const med = (v: number[]) => {
      const s = [...v].sort((a, b) => a - b);
      const m = s.length >> 1;
      return s.length % 2 === 1 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
    };
    const slope = med(slopes);
    return { slope, intercept: med(xs.map((x, i) => ys[i]! - slope * x)) };
  }

  it('gives the sorted medians exactly, on 400 random series', () => {
    let seed = 7;
    const random = () => ((seed = (seed * 48271) % 2147483647), seed / 2147483647);
    for (let run = 0; run < 400; run++) {
      const n = 2 + Math.floor(random() * 120);
      // Coarse values make ties in x, in the slopes and in the offsets common.
      const xs = Array.from({ length: n }, () => Math.round(random() * 40) - 40);
      const ys = Array.from({ length: n }, () => Math.round(random() * 20) / 4);
      const expected = new Set(xs).size < 2 ? null : bySorting(xs, ys);
      const fit = theilSen(xs, ys);
      expect(fit === null ? null : { slope: fit.slope + 0, intercept: fit.intercept + 0 }).toEqual(
        expected && { slope: expected.slope + 0, intercept: expected.intercept + 0 },
      );
    }
  });
});

describe('minutes to the wet limit', () => {
  // Expected values are straight-line arithmetic: a margin of 3 K falling 0.05 K/min reaches the
  // 1 K wet limit in (3 − 1)/0.05 = 40 min. Allowed 1e-9 min: on exact data Theil–Sen is exact.
  const every2Min = Array.from({ length: 16 }, (_, i) => 2 * i); // 0…30 min ago

  it('projects a clean falling margin', () => {
    const samples = line(3, -0.05, every2Min);
    expect(minutesToWet(samples, { nowMs: NOW_MS, wetK: 1 })).toBeCloseTo(40, 9);
    const trend = fitMarginTrend(samples, { nowMs: NOW_MS });
    expect(trend?.slopeKPerMin).toBeCloseTo(-0.05, 12);
    expect(trend?.marginNowK).toBeCloseTo(3, 12);
  });

  it('ignores one outlier that would throw a least-squares fit off by minutes', () => {
    const samples = line(3, -0.05, every2Min);
    samples[3] = { ...samples[3]!, marginK: samples[3]!.marginK! - 4 }; // a 4 K spike, 24 min ago
    expect(minutesToWet(samples, { nowMs: NOW_MS, wetK: 1 })).toBeCloseTo(40, 9);

    // The same data through ordinary least squares, to show the spike matters.
    const xs = samples.map((s) => (s.atMs - NOW_MS) / MINUTE_MS);
    const ys = samples.map((s) => s.marginK!);
    const mx = xs.reduce((a, b) => a + b) / xs.length;
    const my = ys.reduce((a, b) => a + b) / ys.length;
    const slope =
      xs.reduce((a, x, i) => a + (x - mx) * (ys[i]! - my), 0) /
      xs.reduce((a, x) => a + (x - mx) ** 2, 0);
    const leastSquaresMinutes = (1 - (my - slope * mx)) / slope;
    expect(Math.abs(leastSquaresMinutes - 40)).toBeGreaterThan(5);
  });

  it('handles irregular intervals', () => {
    const samples = line(2.2, -0.04, [0, 1.5, 4, 9, 9.5, 17, 26]);
    expect(minutesToWet(samples, { nowMs: NOW_MS, wetK: 1 })).toBeCloseTo(30, 9);
  });

  it.each([
    ['rising', 0.02, 3, null],
    ['flat', 0, 3, null],
    ['falling but 90 min away', -0.02, 2.8, null],
    ['reaching the limit at exactly the 60 min look-ahead', -0.03, 2.8, 60],
    ['already below the limit and falling', -0.05, 0.6, 0],
  ])('returns the right answer when %s', (_label, slope, marginNowK, expected) => {
    const result = minutesToWet(line(marginNowK, slope, every2Min), { nowMs: NOW_MS, wetK: 1 });
    if (expected === null) expect(result).toBeNull();
    else expect(result).toBeCloseTo(expected, 9);
  });

  it('returns null on thin data: too few samples, or too short a span', () => {
    expect(minutesToWet(line(3, -0.1, [0, 5, 10, 15]), { nowMs: NOW_MS, wetK: 1 })).toBeNull();
    expect(minutesToWet(line(3, -0.1, [0, 1, 2, 3, 4, 5]), { nowMs: NOW_MS, wetK: 1 })).toBeNull();
  });

  it('uses only the window before now and skips samples without a margin', () => {
    const samples = [
      ...line(3, -0.05, every2Min),
      // Old and future samples far off the line, and a missing margin: all to be ignored.
      { atMs: NOW_MS - 45 * MINUTE_MS, marginK: 50 },
      { atMs: NOW_MS - 40 * MINUTE_MS, marginK: 50 },
      { atMs: NOW_MS + 5 * MINUTE_MS, marginK: -50 },
      { atMs: NOW_MS - MINUTE_MS, marginK: null },
    ];
    expect(minutesToWet(samples, { nowMs: NOW_MS, wetK: 1 })).toBeCloseTo(40, 9);
  });
});
