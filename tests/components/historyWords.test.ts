// The readout of one chart point (ingest/words/history.ts pointReadout), in the reader's unit.
// Conversions by hand: °F = °C × 1.8 + 32; a margin (a difference) only scales, × 1.8.
import { describe, expect, it } from 'vitest';

import { pointReadout, type ReadoutPoint } from '@/ingest/words';

const base: ReadoutPoint = {
  air: 18,
  rh: 50,
  surface: 17,
  dewPoint: 7.4,
  margin: 9.6,
  marginMin: 9.6,
  marginMax: 9.6,
  emc: 9.3,
  count: 1,
};

describe('point readout', () => {
  it('reads a raw reading in °C', () => {
    expect(pointReadout(base, 'C', '06:10')).toBe(
      '06:10 · air 18.0 °C · surface 17.0 °C · dew point 7.4 °C · margin +9.6 °C · RH 50 % · EMC 9.3 %',
    );
  });

  it('gives a bucket its low and high margin and its reading count, in °F', () => {
    // 18 °C = 64.4 °F, 17 °C = 62.6 °F, 7.4 °C = 45.32 → 45.3 °F; margins 4.5 K = +8.1 °F,
    // −0.5 K = −0.9 °F, 9.6 K = +17.28 → +17.3 °F.
    const point = { ...base, margin: 4.5, marginMin: -0.5, marginMax: 9.6, count: 40 };
    expect(pointReadout(point, 'F', '3 Mar 06:10')).toBe(
      '3 Mar 06:10 · air 64.4 °F · surface 62.6 °F · dew point 45.3 °F · margin +8.1 °F ' +
        '(low -0.9 °F, high +17.3 °F) · RH 50 % · EMC 9.3 % · 40 readings',
    );
  });

  it('names a value below 0.01 °C a frost point (ASHRAE Fundamentals ch. 1: over ice)', () => {
    const cold = { ...base, air: 2, surface: -1, dewPoint: -2.4, margin: 1.4, marginMin: 1.4 };
    expect(pointReadout(cold, 'C', '05:00')).toContain(' · frost point -2.4 °C · ');
  });
});
