// The margin's low–high band of a bucketed series and the crosshair's nearest point
// (components/zones/chartSeries.ts). Expected values are worked by hand in each row.
import { describe, expect, it } from 'vitest';

import type { ReadingPoint } from '@/components/queries';
import { chartSeries, nearestIndex } from '@/components/zones/chartSeries';

const bucket = (at: string, dew: number, min: number, max: number): ReadingPoint => ({
  at,
  air: 18,
  rh: 50,
  surface: dew + (min + max) / 2,
  dewPoint: dew,
  margin: (min + max) / 2,
  marginMin: min,
  marginMax: max,
  emc: 9.3,
  level: min <= 1 ? 'wet' : 'dry',
  count: 40,
});

describe('margin band', () => {
  it('spans dew + lowest to dew + highest margin of each bucket, below the dew line for a dip', () => {
    const points = [
      bucket('2026-03-02T06:00:00Z', 7.4, 9.5, 9.7),
      // A dip to −0.5 K inside a bucket whose highest margin is +9.6 K: 7.4 − 0.5 = 6.9 °C.
      bucket('2026-03-02T06:22:30Z', 7.4, -0.5, 9.6),
    ];
    const series = chartSeries(points, { wetK: 1, cautionK: 3 }, 1350);
    expect(series.marginBand.map((b) => [b.y0, b.y])).toEqual([
      [7.4 + 9.5, 7.4 + 9.7],
      [6.9, 7.4 + 9.6],
    ]);
    // The y domain reaches the dip: floor(6.9 − max(1, 8 % of the spread 18 − 6.9 = 0.89)) = 5.
    expect(series.yDomain[0]).toBe(5);
  });

  it('is empty for raw readings, whose own line already shows every dip', () => {
    const series = chartSeries([bucket('2026-03-02T06:00:00Z', 7.4, 2, 2)], {
      wetK: 1,
      cautionK: 3,
    });
    expect(series.marginBand).toEqual([]);
  });
});

describe('nearestIndex', () => {
  const times = [0, 100, 200, 300];
  it.each([
    [-50, 0],
    [49, 0],
    [50, 0], // a tie goes to the earlier point
    [51, 1],
    [260, 3],
    [1000, 3],
  ])('%d → %d', (at, index) => {
    expect(nearestIndex(times, at)).toBe(index);
  });
  it('finds nothing in an empty series', () => {
    expect(nearestIndex([], 5)).toBe(-1);
  });
});
