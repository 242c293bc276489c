/**
 * Numbers as people read them, the same on screen and in e-mail. Temperatures arrive in °C and
 * margins in K. A dew margin is a difference of two temperatures, so in °F it only scales
 * (1 K = 1.8 °F, no 32 °F offset) and it carries its sign: "+5.4 °F", "-0.9 °F".
 */
import { cToF, kToFDelta, type TemperatureUnit } from '../units';

export const MISSING = '—';

function known(value: number | null | undefined): value is number {
  return value !== null && value !== undefined && Number.isFinite(value);
}

/** Fixed digits without "-0.0": a sign flicker around zero would read as a change. */
function fixed(value: number, digits: number): string {
  const text = Math.abs(value).toFixed(digits);
  if (Number(text) === 0) return (0).toFixed(digits);
  return value < 0 ? `-${text}` : text;
}

/** A temperature: "11.8 °C", "53.2 °F", "—". */
export function formatTemperature(
  valueC: number | null | undefined,
  unit: TemperatureUnit = 'C',
): string {
  if (!known(valueC)) return MISSING;
  return `${fixed(unit === 'F' ? cToF(valueC) : valueC, 1)} °${unit}`;
}

/** A dew margin (a difference): "+4.2 °C", "-0.8 °C", "0.0 °C", "+5.4 °F" for 3 K, "—". */
export function formatMargin(
  marginK: number | null | undefined,
  unit: TemperatureUnit = 'C',
): string {
  if (!known(marginK)) return MISSING;
  const text = fixed(unit === 'F' ? kToFDelta(marginK) : marginK, 1);
  const sign = text.startsWith('-') || Number(text) === 0 ? '' : '+';
  return `${sign}${text} °${unit}`;
}

/** A limit (a temperature difference) in the person's unit, without sign or unit: "5.4". */
export function deltaInUnit(deltaK: number, unit: TemperatureUnit): string {
  return fixed(unit === 'F' ? kToFDelta(deltaK) : deltaK, 1);
}

/** A percentage, no decimals for RH and one for EMC: "78 %", "14.2 %". */
export function formatPercent(value: number | null | undefined, digits = 0): string {
  if (!known(value)) return MISSING;
  return `${fixed(value, digits)} %`;
}

/** A battery voltage: "2.64 V". */
export function formatVolts(value: number | null | undefined): string {
  if (!known(value)) return MISSING;
  return `${fixed(value, 2)} V`;
}
