import { describe, expect, it } from 'vitest';

import {
  annualTowCategory,
  annualWetHours,
  isWetIso9223,
  timeOfWetness,
  towCategory,
  type WetnessReading,
} from '../../ingest/wetness';

const MINUTE_MS = 60_000;
const HOUR_MS = 60 * MINUTE_MS;
const T0_MS = Date.UTC(2026, 2, 2, 0, 0, 0);

describe('the ISO 9223 wetness condition: RH > 80 % and T > 0 °C, both strict', () => {
  it.each([
    [10, 80, false], // exactly 80 % is not above 80 %
    [10, 80.01, true],
    [0, 95, false], // exactly 0 °C is not above 0 °C
    [0.01, 95, true],
    [-5, 100, false],
    [25, 79.99, false],
  ])('air %d °C, RH %d %% → wet %s', (airC, rhPct, wet) => {
    expect(isWetIso9223(airC, rhPct)).toBe(wet);
  });
});

function at(hours: number, airC: number, rhPct: number): WetnessReading {
  return { atMs: T0_MS + hours * HOUR_MS, airC, rhPct };
}

describe('time of wetness over constructed series (exact, to the millisecond)', () => {
  // Each reading holds until the next; expected values are sums of those intervals by hand.
  it('weights each reading by its interval, irregular intervals included', () => {
    const readings = [
      at(0, 12, 85), // wet for 1.5 h
      at(1.5, 12, 80), // exactly 80 %: dry for 0.5 h
      at(2, 0, 90), // exactly 0 °C: dry for 1 h
      at(3, 4, 81), // wet for 0.25 h
      at(3.25, 4, 60), // dry until the end, 0.75 h
    ];
    const tow = timeOfWetness(readings, { endMs: T0_MS + 4 * HOUR_MS, maxGapMs: 2 * HOUR_MS });
    expect(tow).toEqual({ wetMs: 1.75 * HOUR_MS, coveredMs: 4 * HOUR_MS });
  });

  it('caps each interval at the gap limit and leaves the rest out of the covered time', () => {
    const readings = [
      at(0, 15, 90), // wet; next reading 5 h later, capped at 1 h
      at(5, 15, 90), // wet 0.5 h
      at(5.5, 15, 50), // dry; the end is 3 h later, capped at 1 h
    ];
    const tow = timeOfWetness(readings, { endMs: T0_MS + 8.5 * HOUR_MS, maxGapMs: HOUR_MS });
    expect(tow).toEqual({ wetMs: 1.5 * HOUR_MS, coveredMs: 2.5 * HOUR_MS });
  });

  it('gives the same answer for unsorted input and skips readings without values', () => {
    const readings = [at(2, 10, 90), at(0, 10, 95), at(1, Number.NaN, 95)];
    const tow = timeOfWetness(readings, { endMs: T0_MS + 3 * HOUR_MS, maxGapMs: 2 * HOUR_MS });
    // 0–1 h wet; 1–2 h unknown (a gap); 2–3 h wet.
    expect(tow).toEqual({ wetMs: 2 * HOUR_MS, coveredMs: 2 * HOUR_MS });
  });

  it('is empty without readings', () => {
    const tow = timeOfWetness([], { endMs: T0_MS, maxGapMs: HOUR_MS });
    expect(tow).toEqual({ wetMs: 0, coveredMs: 0 });
    expect(annualWetHours(tow)).toBeNull();
    expect(annualTowCategory(tow)).toBeNull();
  });
});

describe('ISO 9223:1992 Table 1 categories of annual time of wetness', () => {
  // τ1 ≤ 10 h, τ2 10–250 h, τ3 250–2500 h, τ4 2500–5500 h, τ5 > 5500 h per year; each upper
  // bound belongs to the lower category.
  it.each([
    [0, 't1'],
    [10, 't1'],
    [10.001, 't2'],
    [250, 't2'],
    [250.001, 't3'],
    [2500, 't3'],
    [2500.001, 't4'],
    [5500, 't4'],
    [5500.001, 't5'],
    [8760, 't5'],
  ])('%d h per year → %s', (hours, category) => {
    expect(towCategory(hours)).toBe(category);
  });

  it('extrapolates from covered time: a week wet a quarter of its covered time → 2190 h, τ3', () => {
    const readings: WetnessReading[] = [];
    // 7 days of hourly readings; the first 6 h of each day wet, the rest dry.
    for (let hour = 0; hour < 7 * 24; hour++) readings.push(at(hour, 18, hour % 24 < 6 ? 92 : 55));
    const tow = timeOfWetness(readings, { endMs: T0_MS + 7 * 24 * HOUR_MS, maxGapMs: HOUR_MS });
    expect(tow.wetMs).toBe(42 * HOUR_MS);
    expect(annualWetHours(tow)).toBeCloseTo(0.25 * 8760, 9);
    expect(annualTowCategory(tow)).toBe('t3');
  });
});
