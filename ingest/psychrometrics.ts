/**
 * Saturation vapour pressure, dew point and frost point from air temperature and relative
 * humidity.
 *
 * Source: the Hyland–Wexler (1983) formulation as given in ASHRAE Handbook — Fundamentals 2017,
 * ch. 1, eq. 5 (over ice, −100…0 °C) and eq. 6 (over liquid water, 0…200 °C). It is the
 * formulation behind ASHRAE's own tables and the npm `psychrolib` package, and its water curve
 * is within 0.03 % of the CRC Handbook's vapour-pressure table over 0…40 °C (closer than Sonntag
 * 1990 or Murphy & Koop 2005, which come within 0.05 % and 0.04 %).
 *
 * Sensors report RH with respect to liquid water also below 0 °C (the WMO convention), so the
 * vapour pressure is always RH × e_w(air), and e_w below 0 °C is eq. 6 extrapolated over
 * supercooled water. Against Murphy & Koop (2005, eq. 10), the reference for supercooled water,
 * that extrapolation is 0.1 % high at −20 °C, 0.7 % at −40 °C and 5 % at −60 °C: a frost point
 * error of about 0.01 K, 0.06 K and 0.35 K. Shops live well above −40 °C.
 *
 * The dew point over water is found by inverting eq. 6. Where it is below freezing, water vapour
 * deposits as frost, so we report the frost point instead: the temperature at which the same
 * vapour pressure saturates over ice (eq. 5 inverted), `over: 'ice'`. The dew margin then uses
 * the frost point. The switch is made at the triple point (0.01 °C, 611.657 Pa), where eq. 5 and
 * eq. 6 meet; switching at exactly 0 °C would leave a 0.001 K backward step, so a dew point that
 * rose with RH could fall. Below 0 °C air at high RH-over-water is supersaturated over ice, so
 * the frost point can exceed the air temperature; that is physics (frost grows on anything at air
 * temperature), not a bug, and it gives a negative margin.
 *
 * Valid range: air −60…85 °C (the sensor contract), RH 0.5…100 %. Anything else returns a typed
 * "not computable" result, never NaN.
 */

export type DewPointResult =
  | { ok: true; dewPointC: number; over: 'water' | 'ice' }
  | { ok: false; reason: 'rh_out_of_range' | 'rh_below_floor' | 'temperature_out_of_range' };

export const AIR_MIN_C = -60;
export const AIR_MAX_C = 85;

/**
 * Below this RH we do not compute a dew point. Capacitive RH sensors are specified to ±2…3 % RH,
 * so a reading under 0.5 % cannot be told from zero, where ln(RH) runs to −∞. The floor also
 * keeps the worst case (−60 °C air at 0.5 %) at a frost point near −90 °C, inside the −100 °C
 * bound of eq. 5.
 */
export const RH_FLOOR_PCT = 0.5;

const ZERO_C_IN_K = 273.15;

// ASHRAE Handbook — Fundamentals 2017, ch. 1, eq. 5 (ice), ln(p / Pa) with T in kelvin.
const C1 = -5.6745359e3;
const C2 = 6.3925247;
const C3 = -9.677843e-3;
const C4 = 6.2215701e-7;
const C5 = 2.0747825e-9;
const C6 = -9.484024e-13;
const C7 = 4.1635019;

// ASHRAE Handbook — Fundamentals 2017, ch. 1, eq. 6 (liquid water), ln(p / Pa), T in kelvin.
const C8 = -5.8002206e3;
const C9 = 1.3914993;
const C10 = -4.8640239e-2;
const C11 = 4.1764768e-5;
const C12 = -1.4452093e-8;
const C13 = 6.5459673;

// Magnus-form first guesses for the Newton inversion, Alduchov & Eskridge (1996): over water
// 610.94 Pa · exp(17.625 t / (243.04 + t)), over ice 611.21 Pa · exp(22.587 t / (273.86 + t)).
// They are within about 0.1 K of eq. 5/6 in shop conditions, so two Newton steps reach 1e-9 K,
// and the exact inversion stays well above a million readings per second.
const LN_MAGNUS_WATER_PA = Math.log(610.94);
const MAGNUS_WATER_A = 17.625;
const MAGNUS_WATER_B_C = 243.04;
const LN_MAGNUS_ICE_PA = Math.log(611.21);
const MAGNUS_ICE_A = 22.587;
const MAGNUS_ICE_B_C = 273.86;

// Newton stops once a step is below this; the error left is then ~(step)² · 0.004 / K ≈ 1e-11 K.
const NEWTON_TOLERANCE_K = 1e-4;
// Far outside shop conditions (RH near the floor at −60 °C) the first guess is a few kelvin off;
// Newton on ln p is still quadratic there and needs at most five steps.
const NEWTON_MAX_STEPS = 8;

/** ln of the saturation vapour pressure over liquid water, Pa; eq. 6. */
function lnSatWaterPa(tempK: number): number {
  return C8 / tempK + C9 + tempK * (C10 + tempK * (C11 + tempK * C12)) + C13 * Math.log(tempK);
}

/** ln of the saturation vapour pressure over ice, Pa; eq. 5. */
function lnSatIcePa(tempK: number): number {
  return (
    C1 / tempK + C2 + tempK * (C3 + tempK * (C4 + tempK * (C5 + tempK * C6))) + C7 * Math.log(tempK)
  );
}

// Vapour pressure at the triple point, where ice and water curves meet: 611.657 Pa (eq. 6 gives
// 611.6570, eq. 5 611.6570; Guildner, Johnson & Jones 1976 measured 611.657 Pa).
export const TRIPLE_POINT_C = 0.01;
const LN_TRIPLE_POINT_PA = lnSatWaterPa(TRIPLE_POINT_C + ZERO_C_IN_K);

/** Saturation vapour pressure over liquid water (supercooled below 0 °C), Pa. */
export function saturationVapourPressureWaterPa(tempC: number): number {
  return Math.exp(lnSatWaterPa(tempC + ZERO_C_IN_K));
}

/** Saturation vapour pressure over ice, Pa. Meaningful at or below 0.01 °C (triple point). */
export function saturationVapourPressureIcePa(tempC: number): number {
  return Math.exp(lnSatIcePa(tempC + ZERO_C_IN_K));
}

/** Dew point over water, °C, for a given ln(vapour pressure / Pa): eq. 6 inverted by Newton. */
function dewPointFromLnPa(lnPa: number): number {
  const g = lnPa - LN_MAGNUS_WATER_PA;
  let tempK = (MAGNUS_WATER_B_C * g) / (MAGNUS_WATER_A - g) + ZERO_C_IN_K;
  for (let step = 0; step < NEWTON_MAX_STEPS; step++) {
    const invK = 1 / tempK;
    const f =
      C8 * invK + C9 + tempK * (C10 + tempK * (C11 + tempK * C12)) + C13 * Math.log(tempK) - lnPa;
    const df = -C8 * invK * invK + C10 + tempK * (2 * C11 + 3 * C12 * tempK) + C13 * invK;
    const stepK = f / df;
    tempK -= stepK;
    if (Math.abs(stepK) < NEWTON_TOLERANCE_K) break;
  }
  return tempK - ZERO_C_IN_K;
}

/** Frost point, °C, for a given ln(vapour pressure / Pa): eq. 5 inverted by Newton. */
function frostPointFromLnPa(lnPa: number): number {
  const g = lnPa - LN_MAGNUS_ICE_PA;
  let tempK = (MAGNUS_ICE_B_C * g) / (MAGNUS_ICE_A - g) + ZERO_C_IN_K;
  for (let step = 0; step < NEWTON_MAX_STEPS; step++) {
    const invK = 1 / tempK;
    const f =
      C1 * invK +
      C2 +
      tempK * (C3 + tempK * (C4 + tempK * (C5 + tempK * C6))) +
      C7 * Math.log(tempK) -
      lnPa;
    const df =
      -C1 * invK * invK + C3 + tempK * (2 * C4 + tempK * (3 * C5 + 4 * C6 * tempK)) + C7 * invK;
    const stepK = f / df;
    tempK -= stepK;
    if (Math.abs(stepK) < NEWTON_TOLERANCE_K) break;
  }
  return tempK - ZERO_C_IN_K;
}

/** Temperature at which `vapourPa` saturates over liquid water, °C. */
export function dewPointFromVapourPressureC(vapourPa: number): number {
  return dewPointFromLnPa(Math.log(vapourPa));
}

/** Temperature at which `vapourPa` saturates over ice, °C. */
export function frostPointFromVapourPressureC(vapourPa: number): number {
  return frostPointFromLnPa(Math.log(vapourPa));
}

type NotComputable = Extract<DewPointResult, { ok: false }>;

function checkInputs(airC: number, rhPct: number): NotComputable | null {
  if (!(airC >= AIR_MIN_C && airC <= AIR_MAX_C)) {
    return { ok: false, reason: 'temperature_out_of_range' };
  }
  if (!(rhPct >= 0 && rhPct <= 100)) return { ok: false, reason: 'rh_out_of_range' };
  if (rhPct < RH_FLOOR_PCT) return { ok: false, reason: 'rh_below_floor' };
  return null;
}

/** ln of the air's vapour pressure, Pa; one log for RH and one inside eq. 6. */
function lnVapourPa(airC: number, rhPct: number): number {
  return Math.log(rhPct / 100) + lnSatWaterPa(airC + ZERO_C_IN_K);
}

/**
 * Dew point over liquid water only, also when it is below 0 °C. Never above the air
 * temperature (RH ≤ 100 %); the clamp removes the last-bit rounding at exactly 100 %.
 */
export function dewPointOverWater(airC: number, rhPct: number): DewPointResult {
  const invalid = checkInputs(airC, rhPct);
  if (invalid) return invalid;
  const dewPointC = Math.min(airC, dewPointFromLnPa(lnVapourPa(airC, rhPct)));
  return { ok: true, dewPointC, over: 'water' };
}

/**
 * The temperature at which a surface starts to collect water from this air: the dew point over
 * water, or, below the triple point (0.01 °C), the frost point over ice for the same vapour
 * pressure.
 */
export function dewPoint(airC: number, rhPct: number): DewPointResult {
  const invalid = checkInputs(airC, rhPct);
  if (invalid) return invalid;
  const lnPa = lnVapourPa(airC, rhPct);
  if (lnPa < LN_TRIPLE_POINT_PA) {
    // Below the triple-point pressure the frost point is below 0.01 °C; the clamp removes the
    // 7e-8 K by which eq. 5 and eq. 6 miss each other there.
    const frostPointC = Math.min(TRIPLE_POINT_C, frostPointFromLnPa(lnPa));
    return { ok: true, dewPointC: frostPointC, over: 'ice' };
  }
  return { ok: true, dewPointC: Math.min(airC, dewPointFromLnPa(lnPa)), over: 'water' };
}
