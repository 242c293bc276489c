/**
 * The ranges a zone's history can show, and what each asks the server for. The fixed ranges
 * count real time back from now (24 h across a daylight-saving change is 24 real hours, so the
 * chart's axis shows 23 or 25 clock hours that day); a custom range is two shop-local clock
 * times, read in the shop's time zone whatever the viewer's is.
 */
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';

export type RangeKey = '6h' | '24h' | '7d' | '30d' | 'custom';

const HOUR_MS = 3_600_000;
const DAY_MS = 24 * HOUR_MS;

/** The server's cap (server/routes/readings.ts): 31 days in one request. */
export const MAX_CUSTOM_MS = 31 * DAY_MS;

export const RANGES: readonly { value: RangeKey; label: string; words: string; ms: number }[] = [
  { value: '6h', label: '6 h', words: 'in the last 6 hours', ms: 6 * HOUR_MS },
  { value: '24h', label: '24 h', words: 'in the last 24 hours', ms: 24 * HOUR_MS },
  { value: '7d', label: '7 days', words: 'in the last 7 days', ms: 7 * DAY_MS },
  { value: '30d', label: '30 days', words: 'in the last 30 days', ms: 30 * DAY_MS },
  { value: 'custom', label: 'Custom', words: 'in this span', ms: 0 },
];

export const DEFAULT_RANGE: RangeKey = '24h';

/** A range key from a URL parameter; anything else is the default. */
export function rangeFromParam(param: string | string[] | undefined): RangeKey {
  const value = Array.isArray(param) ? param[0] : param;
  return RANGES.some((r) => r.value === value) ? (value as RangeKey) : DEFAULT_RANGE;
}

/** How long a fixed range is, in real milliseconds (0 for custom). */
export function rangeMs(key: RangeKey): number {
  return RANGES.find((r) => r.value === key)?.ms ?? 0;
}

/** [from, to] of a fixed range ending at `nowMs`. */
export function fixedWindow(key: Exclude<RangeKey, 'custom'>, nowMs: number) {
  return { fromMs: nowMs - rangeMs(key), toMs: nowMs };
}

/** The chart's heading for a fixed range: "Last 7 days". */
export function rangeHeading(key: RangeKey): string {
  const words = RANGES.find((r) => r.value === key)?.words ?? 'in this span';
  return key === 'custom' ? 'Chosen span' : words.replace(/^in the l/, 'L');
}

/** The HTML datetime-local format a custom range's inputs use, on the shop's clock. */
export const LOCAL_INPUT_FORMAT = "yyyy-MM-dd'T'HH:mm";

/** An instant as the shop's clock shows it, in the inputs' format: "2026-03-29T06:00". */
export function toLocalInput(atMs: number, timeZone: string): string {
  return formatInTimeZone(atMs, timeZone, LOCAL_INPUT_FORMAT);
}

const LOCAL_INPUT = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})$/;

/**
 * A shop-local clock time typed or picked ("2026-03-29T06:00") as an instant, or null when it
 * is not one. A time the spring change skips (02:30 in Berlin on 29 March) is read as the
 * instant an hour later on the new clock, as date-fns-tz does.
 */
export function fromLocalInput(text: string, timeZone: string): number | null {
  const m = LOCAL_INPUT.exec(text.trim());
  if (!m) return null;
  const [, y, mo, d, h, mi] = m.map(Number) as [number, number, number, number, number, number];
  // Reject 2026-02-30 and 25:00 rather than letting them roll over into another day.
  const probe = new Date(Date.UTC(y, mo - 1, d, h, mi));
  if (
    probe.getUTCFullYear() !== y ||
    probe.getUTCMonth() !== mo - 1 ||
    probe.getUTCDate() !== d ||
    probe.getUTCHours() !== h ||
    probe.getUTCMinutes() !== mi
  ) {
    return null;
  }
  const atMs = fromZonedTime(text.trim().replace(' ', 'T'), timeZone).getTime();
  return Number.isFinite(atMs) ? atMs : null;
}

export type CustomRangeCheck =
  { ok: true; fromMs: number; toMs: number } | { ok: false; field: 'from' | 'to'; message: string };

/** Checks a custom range as typed: two clock times, from before to, at most 31 days apart. */
export function checkCustomRange(
  fromText: string,
  toText: string,
  timeZone: string,
): CustomRangeCheck {
  const fromMs = fromLocalInput(fromText, timeZone);
  if (fromMs === null) {
    return { ok: false, field: 'from', message: 'Enter a start as a date and time.' };
  }
  const toMs = fromLocalInput(toText, timeZone);
  if (toMs === null) {
    return { ok: false, field: 'to', message: 'Enter an end as a date and time.' };
  }
  if (fromMs >= toMs) {
    return { ok: false, field: 'to', message: 'The end must come after the start.' };
  }
  if (toMs - fromMs > MAX_CUSTOM_MS) {
    return { ok: false, field: 'to', message: 'Choose at most 31 days at a time.' };
  }
  return { ok: true, fromMs, toMs };
}
