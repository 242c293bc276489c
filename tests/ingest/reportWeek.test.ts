// The report's week in a shop's time zone, and the reference figures of a zone over a week.
import { describe, expect, it } from 'vitest';

import {
  isMonday,
  lastCompleteWeekStart,
  weekBounds,
  weekFiguresFromReadings,
  weekStartOf,
  type ReportReading,
} from '@/ingest/reportWeek';
import { TOW_MAX_GAP_MS } from '@/ingest/wetness';
import { weekNote } from '@/ingest/words/report';

const H = 3_600_000;
const MIN = 60_000;

describe('weekBounds', () => {
  it.each([
    // EU summer time begins on the last Sunday of March, 01:00 UTC (Directive 2000/84/EC):
    // 2026-03-29, so Berlin's week of Monday 2026-03-23 loses an hour.
    ['Europe/Berlin', '2026-03-23', '2026-03-22T23:00:00.000Z', '2026-03-29T22:00:00.000Z', 167],
    // US daylight time ends on the first Sunday of November, 02:00 local (Energy Policy Act of
    // 2005, sec. 110): 2026-11-01, so Chicago's week of Monday 2026-10-26 gains one.
    ['America/Chicago', '2026-10-26', '2026-10-26T05:00:00.000Z', '2026-11-02T06:00:00.000Z', 169],
    // A week with no change: 7 × 24 h.
    ['Europe/Berlin', '2026-06-15', '2026-06-14T22:00:00.000Z', '2026-06-21T22:00:00.000Z', 168],
    // UTC itself never changes.
    ['UTC', '2026-11-30', '2026-11-30T00:00:00.000Z', '2026-12-07T00:00:00.000Z', 168],
  ])('%s, week of %s', (tz, start, from, to, hours) => {
    const week = weekBounds(start, tz);
    expect(new Date(week.fromMs).toISOString()).toBe(from);
    expect(new Date(week.toMs).toISOString()).toBe(to);
    expect(week.hours).toBe(hours);
  });

  it('says when a week is not 168 hours long, and on which Sunday', () => {
    expect(weekNote('2026-03-23', 'Europe/Berlin')).toBe(
      'This week had 167 hours: clocks went forward on Sunday 29 March.',
    );
    expect(weekNote('2026-10-26', 'America/Chicago')).toBe(
      'This week had 169 hours: clocks went back on Sunday 1 November.',
    );
    expect(weekNote('2026-06-15', 'Europe/Berlin')).toBeNull();
  });

  it.each(['2026-03-24', '2026-03-29', '2026-02-30', '2026-13-01', 'abc', '2026-3-23'])(
    'refuses %s, which is not a Monday',
    (start) => {
      expect(isMonday(start)).toBe(false);
      expect(() => weekBounds(start, 'Europe/Berlin')).toThrow(RangeError);
    },
  );

  it('finds the week of a moment in the shop, not in UTC', () => {
    // 2026-03-29T22:30Z is already Monday 00:30 in Berlin (CEST, +02), still Sunday in UTC.
    const ms = Date.parse('2026-03-29T22:30:00Z');
    expect(weekStartOf(ms, 'Europe/Berlin')).toBe('2026-03-30');
    expect(weekStartOf(ms, 'UTC')).toBe('2026-03-23');
    expect(lastCompleteWeekStart(ms, 'Europe/Berlin')).toBe('2026-03-23');
    expect(lastCompleteWeekStart(ms, 'UTC')).toBe('2026-03-16');
  });
});

const reading = (
  sensorId: string,
  atMs: number,
  airC: number,
  rhPct: number,
  marginK: number | null,
  level: ReportReading['level'],
): ReportReading => ({ sensorId, atMs, airC, rhPct, marginK, emcPct: null, level });

describe('weekFiguresFromReadings', () => {
  const fromMs = Date.parse('2026-06-15T00:00:00Z');
  const endMs = fromMs + 2 * H;
  const opts = { fromMs, endMs, maxGapMs: TOW_MAX_GAP_MS };

  it('merges two sensors of a zone in time order, ties by sensor id', () => {
    const figures = weekFiguresFromReadings(
      [
        // Sensor b at 00:05 and sensor a at 00:05: a (lower id) first, so it stands 0 min and
        // b stands to 00:10 (5 min). a at 00:00 stands 5 min; b at 00:10 stands the 15 min cap.
        reading('b', fromMs + 5 * MIN, 30, 90, 0.5, 'wet'),
        reading('a', fromMs + 5 * MIN, 10, 50, 5, 'dry'),
        reading('a', fromMs, 20, 50, 2, 'close'),
        reading('b', fromMs + 10 * MIN, 10, 50, 5, 'dry'),
        // Outside the period: ignored.
        reading('a', endMs, 40, 99, -5, 'wet'),
        reading('a', fromMs - MIN, 40, 99, -5, 'wet'),
      ],
      opts,
    );
    expect(figures.readings).toBe(4);
    expect(figures.coveredMs).toBe(25 * MIN);
    expect(figures.levelMs).toEqual({
      close: 5 * MIN,
      dry: 15 * MIN,
      wet: 5 * MIN,
      unknown: 2 * H - 25 * MIN,
    });
    // Mean air: (20·5 + 10·0 + 30·5 + 10·15) / 25 = 16; min and max over all four readings.
    expect(figures.airC).toEqual({ min: 10, mean: 16, max: 30 });
    expect(figures.lowestMargin).toEqual({ marginK: 0.5, atMs: fromMs + 5 * MIN });
    // ISO 9223: only b at 00:05 (30 °C, 90 %), 5 min.
    expect(figures.wetnessMs).toBe(5 * MIN);
    expect(figures.annualWetHours).toBeCloseTo((5 / 25) * 8760, 9);
    // After b at 00:10 + 15 min, nothing until the end.
    expect(figures.silentPeriods).toEqual([{ fromMs: fromMs + 25 * MIN, toMs: endMs }]);
  });

  it('counts a late first reading as silence only beyond the cap', () => {
    const late = weekFiguresFromReadings([reading('a', fromMs + 16 * MIN, 10, 50, 5, 'dry')], opts);
    expect(late.silentPeriods[0]).toEqual({ fromMs, toMs: fromMs + 16 * MIN });
    const early = weekFiguresFromReadings(
      [reading('a', fromMs + 15 * MIN, 10, 50, 5, 'dry')],
      opts,
    );
    expect(early.silentPeriods[0]).toEqual({ fromMs: fromMs + 30 * MIN, toMs: endMs });
    // The first 15 min are not covered even so: no reading stands for them.
    expect(early.coveredMs).toBe(15 * MIN);
  });

  it('gives an empty zone no coverage, nulls and all hours unknown', () => {
    const none = weekFiguresFromReadings([], opts);
    expect(none).toMatchObject({
      readings: 0,
      coveredMs: 0,
      airC: { min: null, mean: null, max: null },
      lowestMargin: null,
      levelMs: { dry: 0, close: 0, wet: 0, unknown: 2 * H },
      annualWetHours: null,
      silentPeriods: [{ fromMs, toMs: endMs }],
    });
  });

  it('leaves a reading of unknown level in the unknown hours', () => {
    const f = weekFiguresFromReadings([reading('a', fromMs, 10, 50, null, 'unknown')], opts);
    expect(f.coveredMs).toBe(15 * MIN);
    expect(f.levelMs.unknown).toBe(2 * H);
    expect(f.lowestMargin).toBeNull();
  });
});
