/**
 * The time span a zone's chart shows. A zone with a day of history shows its last 24 hours; a
 * newer zone shows what there is, from its first reading to now, so a first hour of readings
 * fills the chart instead of being a sliver at its right edge. Never less than an hour: two
 * readings a minute apart would otherwise be stretched into a chart of nothing.
 */
export const MIN_SPAN_MS = 60 * 60_000;

export interface ChartSpanInput {
  /** The window asked for (24 h back from `toMs`). */
  fromMs: number;
  toMs: number;
  /** The zone's first reading ever, or null when it has none. */
  firstAtMs: number | null;
  minSpanMs?: number;
}

export interface ChartSpan {
  fromMs: number;
  toMs: number;
  /** True while the zone's history is shorter than the window. */
  partial: boolean;
  firstAtMs: number | null;
}

export function chartSpan({
  fromMs,
  toMs,
  firstAtMs,
  minSpanMs = MIN_SPAN_MS,
}: ChartSpanInput): ChartSpan {
  if (firstAtMs === null || !Number.isFinite(firstAtMs) || firstAtMs <= fromMs) {
    return { fromMs, toMs, partial: false, firstAtMs };
  }
  const start = Math.max(fromMs, Math.min(firstAtMs, toMs - minSpanMs));
  return { fromMs: start, toMs, partial: true, firstAtMs };
}

/** The chart's heading: "Last 24 hours", or "Since the first reading, 06:10" for a newer zone. */
export function spanHeading(span: ChartSpan, clock: (ms: number) => string): string {
  return span.partial && span.firstAtMs !== null
    ? `Since the first reading, ${clock(span.firstAtMs)}`
    : 'Last 24 hours';
}
