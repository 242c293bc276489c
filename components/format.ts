/**
 * How numbers and times read on screen. Pure functions: the current time is passed in.
 * Temperatures arrive in °C and margins in K; a margin is a difference, so it is shown as a
 * signed °C difference (1 K = 1 °C of difference).
 */
import { formatInTimeZone } from 'date-fns-tz';

// The file, not '@/ingest': the package index would bring zod into the web bundle.
import { cToF, kToFDelta, type TemperatureUnit } from '@/ingest/units';

export const MISSING = '—';

function fixed(value: number, digits: number): string {
  const text = Math.abs(value).toFixed(digits);
  // -0.0 reads as a sign flicker around zero; show it as 0.0.
  if (Number(text) === 0) return (0).toFixed(digits);
  return value < 0 ? `-${text}` : text;
}

/**
 * A dew margin: "+4.2 °C", "-0.8 °C", "—"; in Fahrenheit degrees a difference only scales
 * (3 K = +5.4 °F).
 */
export function formatMargin(
  marginK: number | null | undefined,
  unit: TemperatureUnit = 'C',
): string {
  if (marginK === null || marginK === undefined || !Number.isFinite(marginK)) return MISSING;
  const text = fixed(unit === 'F' ? kToFDelta(marginK) : marginK, 1);
  const sign = text.startsWith('-') || Number(text) === 0 ? '' : '+';
  return `${sign}${text} °${unit}`;
}

/** A temperature: "11.8 °C", "53.2 °F", "—". */
export function formatTemperature(
  valueC: number | null | undefined,
  unit: TemperatureUnit = 'C',
): string {
  if (valueC === null || valueC === undefined || !Number.isFinite(valueC)) return MISSING;
  return `${fixed(unit === 'F' ? cToF(valueC) : valueC, 1)} °${unit}`;
}

/** A limit (a temperature difference) in the person's unit, for a form field: "5.4". */
export function deltaInUnit(deltaK: number, unit: TemperatureUnit): string {
  return fixed(unit === 'F' ? kToFDelta(deltaK) : deltaK, 1);
}

/** A percentage with no decimals for RH and one for EMC: "78 %", "14.2 %". */
export function formatPercent(value: number | null | undefined, digits = 0): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return MISSING;
  return `${fixed(value, digits)} %`;
}

/**
 * When a zone was last heard from: "just now", "2 min ago", "3 h ago" within the day, then
 * the shop's local date and time.
 */
export function formatLastSeen(atIso: string, nowMs: number, timeZone: string): string {
  const atMs = Date.parse(atIso);
  if (Number.isNaN(atMs)) return MISSING;
  const ageS = Math.max(0, Math.round((nowMs - atMs) / 1000));
  if (ageS < 60) return 'just now';
  const ageMin = Math.floor(ageS / 60);
  if (ageMin < 60) return `${ageMin} min ago`;
  const ageH = Math.floor(ageMin / 60);
  if (ageH < 12) return `${ageH} h ago`;
  return formatInTimeZone(atMs, timeZone, 'd MMM HH:mm');
}
