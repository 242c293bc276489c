// The chart's span (components/zones/chartSpan.ts): a day of history shows 24 h, a newer zone
// what there is, never less than an hour.
import { describe, expect, it } from 'vitest';

import { chartSpan, MIN_SPAN_MS, spanHeading } from '@/components/zones/chartSpan';

const HOUR = 3_600_000;
const toMs = Date.parse('2026-03-02T12:00:00Z');
const fromMs = toMs - 24 * HOUR;

describe('chartSpan', () => {
  it('spans the whole window once the zone has a day of history', () => {
    expect(chartSpan({ fromMs, toMs, firstAtMs: fromMs - 10 * HOUR })).toMatchObject({
      fromMs,
      toMs,
      partial: false,
    });
    // Exactly a day old counts as a day.
    expect(chartSpan({ fromMs, toMs, firstAtMs: fromMs }).partial).toBe(false);
  });

  it('starts at the first reading of a zone younger than the window', () => {
    const firstAtMs = toMs - 3 * HOUR;
    expect(chartSpan({ fromMs, toMs, firstAtMs })).toEqual({
      fromMs: firstAtMs,
      toMs,
      partial: true,
      firstAtMs,
    });
  });

  it('never spans less than an hour', () => {
    const firstAtMs = toMs - 5 * 60_000;
    const span = chartSpan({ fromMs, toMs, firstAtMs });
    expect(span.toMs - span.fromMs).toBe(MIN_SPAN_MS);
    expect(span.partial).toBe(true);
  });

  it('keeps the whole window for a zone with no readings', () => {
    expect(chartSpan({ fromMs, toMs, firstAtMs: null })).toMatchObject({ fromMs, partial: false });
  });

  it('says which span it shows', () => {
    const clock = (ms: number) => new Date(ms).toISOString().slice(11, 16);
    expect(spanHeading(chartSpan({ fromMs, toMs, firstAtMs: null }), clock)).toBe('Last 24 hours');
    expect(spanHeading(chartSpan({ fromMs, toMs, firstAtMs: toMs - 2 * HOUR }), clock)).toBe(
      'Since the first reading, 10:00',
    );
  });
});
