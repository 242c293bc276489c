// The chart in words (components/zones/chartSummary.ts): the summary line under the chart and
// the values table, in the reader's unit and on the shop's clock.
import { describe, expect, it } from 'vitest';

import type { ReadingPoint } from '@/components/queries';
import { lowestMargin, summaryLine, valueRows } from '@/components/zones/chartSummary';

function point(at: string, margin: number | null, extra: Partial<ReadingPoint> = {}): ReadingPoint {
  return {
    at,
    air: 15,
    rh: 70,
    surface: margin === null ? null : 10 + margin,
    dewPoint: margin === null ? null : 10,
    margin,
    marginMin: margin,
    marginMax: margin,
    emc: 13,
    level: 'dry',
    count: 1,
    ...extra,
  };
}

// Chicago in March 2026 is on CDT (UTC−5) from the 8th: 11:52Z is 06:52 local.
const TZ = 'America/Chicago';
const NOW = Date.parse('2026-03-10T14:00:00Z');

describe('lowestMargin', () => {
  it("takes a bucket's own lowest, not its mean, and the first of equal lows", () => {
    const points = [
      point('2026-03-10T10:00:00Z', 3),
      point('2026-03-10T11:00:00Z', 2, { marginMin: 0.4, count: 12 }),
      point('2026-03-10T12:00:00Z', 0.4),
    ];
    expect(lowestMargin(points)).toEqual({
      marginK: 0.4,
      atMs: Date.parse('2026-03-10T11:00:00Z'),
    });
  });

  it('is null without any margin', () => {
    expect(lowestMargin([point('2026-03-10T10:00:00Z', null)])).toBeNull();
    expect(lowestMargin([])).toBeNull();
  });
});

describe('summaryLine', () => {
  const points = [point('2026-03-10T11:00:00Z', 2.1), point('2026-03-10T11:52:00Z', 0.4)];

  it('names the lowest margin and its time on the shop clock, in °C', () => {
    expect(summaryLine(points, 'C', TZ, NOW)).toBe(
      'Lowest margin +0.4 °C in the last 24 hours, at 06:52',
    );
  });

  // A margin is a difference: 0.4 K is 0.72 °F, without the 32 °F offset (ingest/words/format.ts).
  it('converts the margin as a difference in °F', () => {
    expect(summaryLine(points, 'F', TZ, NOW)).toBe(
      'Lowest margin +0.7 °F in the last 24 hours, at 06:52',
    );
  });

  it('names the weekday when the lowest was on another day', () => {
    const yesterday = [point('2026-03-09T23:30:00Z', -1.5), point('2026-03-10T12:00:00Z', 3)];
    // 23:30Z on the 9th is 18:30 CDT on Monday the 9th.
    expect(summaryLine(yesterday, 'C', TZ, NOW)).toBe(
      'Lowest margin -1.5 °C in the last 24 hours, at Mon 18:30',
    );
  });

  it('says why there is no margin', () => {
    expect(summaryLine([], 'C', TZ, NOW)).toMatch(/No readings/);
    expect(summaryLine([point('2026-03-10T11:00:00Z', null)], 'C', TZ, NOW)).toMatch(
      /No dew margin/,
    );
  });
});

describe('valueRows', () => {
  it('lists the newest points first, surface and dew point as temperatures in °F', () => {
    const points = [
      point('2026-03-10T11:00:00Z', 2),
      point('2026-03-10T11:10:00Z', 1, { surface: 11, dewPoint: 10 }),
    ];
    // 11 °C = 51.8 °F, 10 °C = 50.0 °F (×1.8 + 32); a 1 K margin is +1.8 °F (×1.8 only).
    expect(valueRows(points, 'F', TZ, NOW)[0]).toEqual({
      key: '2026-03-10T11:10:00Z',
      time: '06:10',
      surface: '51.8 °F',
      dewPoint: '50.0 °F',
      margin: '+1.8 °F',
    });
    expect(valueRows(points, 'F', TZ, NOW).map((r) => r.time)).toEqual(['06:10', '06:00']);
  });

  it('keeps only the newest rows', () => {
    const points = Array.from({ length: 30 }, (_, i) =>
      point(new Date(Date.parse('2026-03-10T10:00:00Z') + i * 60_000).toISOString(), 2),
    );
    const rows = valueRows(points, 'C', TZ, NOW, 12);
    expect(rows).toHaveLength(12);
    expect(rows[0]!.key).toBe(points[29]!.at);
  });

  it('shows a dash where a value is missing', () => {
    expect(valueRows([point('2026-03-10T11:00:00Z', null)], 'C', TZ, NOW)[0]).toMatchObject({
      surface: '—',
      dewPoint: '—',
      margin: '—',
    });
  });
});
