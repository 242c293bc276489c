import { describe, expect, it } from 'vitest';

import { chartSeries, seriesInUnit } from '@/components/zones/chartSeries';
import type { ReadingPoint } from '@/components/queries';

const point: ReadingPoint = {
  at: '2026-03-02T06:10:00.000Z',
  air: 20,
  rh: 50,
  surface: 10,
  dewPoint: 0,
  margin: 10,
  marginMin: 10,
  marginMax: 10,
  emc: 9,
  level: 'dry',
  count: 1,
};

describe('the chart in °F', () => {
  it('converts every line and band edge as an absolute temperature', () => {
    const inC = chartSeries([point], { wetK: 1, cautionK: 3 });
    const inF = seriesInUnit(inC, 'F');
    // °F = °C × 9/5 + 32: 20 → 68, 10 → 50, 0 → 32; band edges 0+1 → 33.8, 0+3 → 37.4.
    expect(inF.air[0]!.y).toBeCloseTo(68, 10);
    expect(inF.surface[0]!.y).toBeCloseTo(50, 10);
    expect(inF.dewPoint[0]!.y).toBeCloseTo(32, 10);
    expect([inF.wetBand[0]!.y0, inF.wetBand[0]!.y]).toEqual([32, 33.8]);
    expect(inF.closeBand[0]!.y).toBeCloseTo(37.4, 10);
    expect(inF.yDomain[0]).toBeLessThanOrEqual(32);
    expect(inF.yDomain[1]).toBeGreaterThanOrEqual(68);
    expect(seriesInUnit(inC, 'C')).toBe(inC);
  });
});
