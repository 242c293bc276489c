/**
 * Temperature units. Absolute temperatures convert with an offset; differences (a dew margin, a
 * limit, a hysteresis band) only scale, so 3 K is 5.4 °F, not 37.4 °F. Exact by definition of the
 * Fahrenheit scale (1 °F = 5/9 K, 32 °F = 0 °C), valid for any finite value.
 */
export type TemperatureUnit = 'C' | 'F';

export function fToC(valueF: number): number {
  return ((valueF - 32) * 5) / 9;
}

export function cToF(valueC: number): number {
  return (valueC * 9) / 5 + 32;
}

/** A temperature difference in kelvin expressed in Fahrenheit degrees (3 K → 5.4 °F). */
export function kToFDelta(deltaK: number): number {
  return (deltaK * 9) / 5;
}

/** A temperature difference in Fahrenheit degrees expressed in kelvin (5.4 °F → 3 K). */
export function fDeltaToK(deltaF: number): number {
  return (deltaF * 5) / 9;
}
