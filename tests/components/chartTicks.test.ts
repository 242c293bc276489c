import { describe, expect, it } from 'vitest';

import {
  clockTicks,
  hourTickLabel,
  hourTicks,
  tickStepMinutes,
} from '@/components/zones/chartTicks';

const iso = (ms: number) => new Date(ms).toISOString();

describe('hourTicks', () => {
  it('puts ticks on whole hours of the shop clock, not UTC', () => {
    // Kolkata is UTC+05:30 all year: local 06:00 is 00:30Z.
    const from = Date.parse('2026-03-02T00:00:00Z');
    const to = Date.parse('2026-03-02T12:00:00Z');
    expect(hourTicks(from, to, 'Asia/Kolkata', 6).map(iso)).toEqual([
      '2026-03-02T00:30:00.000Z',
      '2026-03-02T06:30:00.000Z',
    ]);
  });

  it('keeps local hours across a DST change (Chicago, 8 March 2026)', () => {
    const from = Date.parse('2026-03-08T05:00:00Z'); // 23:00 CST on the 7th
    const to = Date.parse('2026-03-08T15:00:00Z'); // 10:00 CDT
    const labels = hourTicks(from, to, 'America/Chicago', 3).map((t) =>
      hourTickLabel(t, 'America/Chicago'),
    );
    expect(labels).toEqual(['Sun', '03:00', '06:00', '09:00']);
  });
});

describe('clock ticks for a short span', () => {
  it('an hour on a phone gets quarter hours on the shop clock', () => {
    const from = Date.parse('2026-03-02T06:05:00Z');
    const to = Date.parse('2026-03-02T07:05:00Z');
    const step = tickStepMinutes(to - from, 340);
    expect(step).toBe(15);
    expect(clockTicks(from, to, 'Asia/Kolkata', step).map(iso)).toEqual([
      '2026-03-02T06:15:00.000Z',
      '2026-03-02T06:30:00.000Z',
      '2026-03-02T06:45:00.000Z',
      '2026-03-02T07:00:00.000Z',
    ]);
  });

  it('a day keeps labels about 70 px apart', () => {
    expect(tickStepMinutes(24 * 3_600_000, 340)).toBe(360);
    expect(tickStepMinutes(24 * 3_600_000, 1000)).toBe(120);
  });
});
