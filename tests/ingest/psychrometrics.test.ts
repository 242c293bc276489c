import psychrolib from 'psychrolib';
import { describe, expect, it } from 'vitest';

import {
  AIR_MAX_C,
  AIR_MIN_C,
  dewPoint,
  dewPointFromVapourPressureC,
  frostPointFromVapourPressureC,
  RH_FLOOR_PCT,
  saturationVapourPressureIcePa,
  saturationVapourPressureWaterPa,
} from '../../ingest/psychrometrics';

/**
 * CRC Handbook of Chemistry and Physics (73rd ed., 1992–93), "Vapor pressure of water from 0 to
 * 370 °C", kPa. Typed in from memory of the published table, then checked digit by digit against
 * a reproduction of that edition's table.
 */
const CRC_WATER_KPA: Record<number, number> = {
  1: 0.65716,
  2: 0.70605,
  3: 0.75813,
  5: 0.8726,
  10: 1.2281,
  15: 1.7056,
  19: 2.1978,
  20: 2.3388,
  25: 3.169,
  29: 4.0078,
  30: 4.2455,
  35: 5.6267,
  40: 7.3814,
};

function crcKpa(tempC: number): number {
  const kPa = CRC_WATER_KPA[tempC];
  if (kPa === undefined) throw new Error(`no CRC value typed in for ${tempC} °C`);
  return kPa;
}

describe('dew point against exact pairs from the CRC vapour-pressure table', () => {
  // RH = 100 · p(Td) / p(T) with both pressures read from the table: the pair (T, RH) → Td holds
  // with no formula involved. Allowed error 0.05 K (the tolerance). Expected: below
  // 0.01 K, since eq. 6 and the table differ by at most 0.03 % over 0…40 °C, i.e. ≤ 0.005 K.
  const pairs: [airC: number, dewPointC: number][] = [
    [40, 40],
    [40, 30],
    [40, 20],
    [40, 10],
    [40, 3],
    [35, 25],
    [30, 29],
    [30, 20],
    [30, 10],
    [25, 20],
    [25, 15],
    [25, 5],
    [20, 19],
    [20, 10],
    [20, 5],
    [15, 10],
    [15, 1],
    [10, 5],
    [10, 2],
    [5, 1],
    [1, 1],
  ];

  it.each(pairs)('air %d °C with the RH of a %d °C dew point', (airC, expectedC) => {
    const rhPct = (100 * crcKpa(expectedC)) / crcKpa(airC);
    expect(rhPct).toBeGreaterThanOrEqual(10);
    const result = dewPoint(airC, rhPct);
    expect(result).toMatchObject({ ok: true, over: 'water' });
    if (!result.ok) return;
    expect(Math.abs(result.dewPointC - expectedC)).toBeLessThanOrEqual(0.05);
  });
});

describe('agreement with npm psychrolib (ASHRAE 2017 ch. 1 functions) over −20…50 °C × 5…100 %', () => {
  psychrolib.SetUnitSystem(psychrolib.SI);

  /**
   * Murphy & Koop (2005), Q. J. R. Meteorol. Soc. 131, eq. 10: vapour pressure over supercooled
   * liquid water, Pa, 123…332 K. Coefficients from memory of the paper; they reproduce the
   * triple-point pressure (611.657 Pa) to 1 mPa, which a wrong digit would not.
   */
  function murphyKoopWaterPa(tempC: number): number {
    const t = tempC + 273.15;
    return Math.exp(
      54.842763 -
        6763.22 / t -
        4.21 * Math.log(t) +
        0.000367 * t +
        Math.tanh(0.0415 * (t - 218.8)) *
          (53.878 - 1331.22 / t - 9.44523 * Math.log(t) + 0.014025 * t),
    );
  }

  /**
   * psychrolib's dew point for our convention. Above 0.01 °C its RH is over water, as ours is.
   * At or below 0.01 °C it takes RH over ice, so there we hand it the vapour pressure of RH over
   * water instead, computed from Murphy & Koop rather than from our own code, and pass 50 °C as
   * its dry-bulb argument: that is only a first guess and a cap (it returns min(result, dry
   * bulb)), and the cap would hide frost points above a sub-zero air temperature.
   */
  function reference(airC: number, rhPct: number): number {
    if (airC > 0.01) return psychrolib.GetTDewPointFromRelHum(airC, rhPct / 100);
    return psychrolib.GetTDewPointFromVapPres(50, (rhPct / 100) * murphyKoopWaterPa(airC));
  }

  const airs = [-20, -15, -10, -5, 0, 5, 10, 15, 20, 25, 30, 35, 40, 45, 50];
  const rhs = [5, 10, 20, 30, 40, 50, 60, 70, 80, 90, 95, 100];
  const grid = airs.flatMap((airC) => rhs.map((rhPct) => [airC, rhPct] as const));

  // Allowed error 0.05 K (the tolerance). Above 0 °C both sides use Hyland–Wexler, so
  // only psychrolib's 0.001 K stopping rule separates them. Below 0 °C the supercooled-water
  // pressure comes from Murphy & Koop, which is 0.1 % below eq. 6 at −20 °C: about 0.012 K.
  it.each(grid)('air %d °C, RH %d %%', (airC, rhPct) => {
    const result = dewPoint(airC, rhPct);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(Math.abs(result.dewPointC - reference(airC, rhPct))).toBeLessThanOrEqual(0.05);
  });

  it('uses the same phase as psychrolib: ice below the triple point, water above', () => {
    // 5 °C at 20 % has a vapour pressure below 611.657 Pa: psychrolib inverts its ice branch.
    expect(dewPoint(5, 20)).toMatchObject({ ok: true, over: 'ice' });
    expect(dewPoint(5, 90)).toMatchObject({ ok: true, over: 'water' });
  });
});

describe('saturation vapour pressure', () => {
  // The triple point of water, 611.657 Pa (Guildner, Johnson & Jones 1976, as adopted by
  // Wexler 1976): both curves must meet there. Allowed 0.01 Pa, the last digit quoted.
  it('meets 611.657 Pa at the triple point on both curves', () => {
    expect(Math.abs(saturationVapourPressureWaterPa(0.01) - 611.657)).toBeLessThanOrEqual(0.01);
    expect(Math.abs(saturationVapourPressureIcePa(0.01) - 611.657)).toBeLessThanOrEqual(0.01);
  });

  /**
   * Over ice, against Murphy & Koop (2005) eq. 7 (from memory of the paper; it meets the triple
   * point within 1 mPa). Allowed 0.1 %: the two formulations differ by < 0.09 % down to −100 °C,
   * about 0.01 K in frost point.
   */
  it.each([0, -10, -20, -40, -60, -80, -100])('over ice at %d °C', (tempC) => {
    const t = tempC + 273.15;
    const murphyKoopIcePa = Math.exp(
      9.550426 - 5723.265 / t + 3.53068 * Math.log(t) - 0.00728332 * t,
    );
    const relErr = saturationVapourPressureIcePa(tempC) / murphyKoopIcePa - 1;
    expect(Math.abs(relErr)).toBeLessThanOrEqual(0.001);
  });

  /**
   * Over supercooled water, eq. 6 extrapolated below its 0 °C bound, against Murphy & Koop eq. 10
   * (the reference for supercooled water). Allowed: 0.3 % to −30 °C (≤ 0.03 K in frost point),
   * 1 % at −40 °C (≈ 0.09 K); measured 0.1 % at −20 °C and 0.7 % at −40 °C. The comment in
   * psychrometrics.ts quotes these numbers.
   */
  it.each([
    [-5, 0.003],
    [-10, 0.003],
    [-20, 0.003],
    [-30, 0.003],
    [-40, 0.01],
  ])('over supercooled water at %d °C within %d relative', (tempC, allowed) => {
    const t = tempC + 273.15;
    const murphyKoopPa = Math.exp(
      54.842763 -
        6763.22 / t -
        4.21 * Math.log(t) +
        0.000367 * t +
        Math.tanh(0.0415 * (t - 218.8)) *
          (53.878 - 1331.22 / t - 9.44523 * Math.log(t) + 0.014025 * t),
    );
    const relErr = saturationVapourPressureWaterPa(tempC) / murphyKoopPa - 1;
    expect(Math.abs(relErr)).toBeLessThanOrEqual(allowed);
  });

  it('inverts exactly: the dew and frost point of p(T) is T (round trip, 1e-6 K)', () => {
    for (const tempC of [-60, -30, -5, 0.01, 5, 20, 40, 85]) {
      const waterPa = saturationVapourPressureWaterPa(tempC);
      expect(dewPointFromVapourPressureC(waterPa)).toBeCloseTo(tempC, 6);
    }
    for (const tempC of [-90, -60, -30, -5, 0.01]) {
      const icePa = saturationVapourPressureIcePa(tempC);
      expect(frostPointFromVapourPressureC(icePa)).toBeCloseTo(tempC, 6);
    }
  });
});

describe('frost point below freezing', () => {
  it('uses the frost point, which lies above the dew point over water', () => {
    // −10 °C air at 50 %: 143.3 Pa; over ice that saturates at about −16.5 °C, over water at
    // −18.5 °C. The figures follow from eq. 5/6; the ordering is the physics being checked.
    const result = dewPoint(-10, 50);
    expect(result).toMatchObject({ ok: true, over: 'ice' });
    if (!result.ok) return;
    expect(result.dewPointC).toBeGreaterThan(-17);
    expect(result.dewPointC).toBeLessThan(-16);
  });

  it('puts the frost point above sub-zero air at 100 % RH over water (ice supersaturation)', () => {
    // e_w/e_i at −10 °C is 1.10 (WMO tables, from memory), so frost forms at about −8.9 °C.
    const result = dewPoint(-10, 100);
    expect(result).toMatchObject({ ok: true, over: 'ice' });
    if (!result.ok) return;
    expect(result.dewPointC).toBeGreaterThan(-9);
    expect(result.dewPointC).toBeLessThan(-8.8);
  });
});

describe('not computable inputs return a typed reason, never NaN', () => {
  it.each([
    [20, 0, 'rh_below_floor'],
    [20, RH_FLOOR_PCT - 0.01, 'rh_below_floor'],
    [20, -1, 'rh_out_of_range'],
    [20, 100.01, 'rh_out_of_range'],
    [20, Number.NaN, 'rh_out_of_range'],
    [AIR_MIN_C - 0.01, 50, 'temperature_out_of_range'],
    [AIR_MAX_C + 0.01, 50, 'temperature_out_of_range'],
    [Number.NaN, 50, 'temperature_out_of_range'],
    [Number.POSITIVE_INFINITY, 50, 'temperature_out_of_range'],
  ])('air %d °C, RH %d %% → %s', (airC, rhPct, reason) => {
    expect(dewPoint(airC, rhPct)).toEqual({ ok: false, reason });
  });

  it.each([
    [AIR_MIN_C, RH_FLOOR_PCT],
    [AIR_MIN_C, 100],
    [AIR_MAX_C, RH_FLOOR_PCT],
    [AIR_MAX_C, 100],
    [0, RH_FLOOR_PCT],
  ])('computes a finite value at the corner air %d °C, RH %d %%', (airC, rhPct) => {
    const result = dewPoint(airC, rhPct);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(Number.isFinite(result.dewPointC)).toBe(true);
    // Eq. 5 is stated down to −100 °C; the floor keeps the worst corner inside it.
    expect(result.dewPointC).toBeGreaterThan(-100);
  });
});
