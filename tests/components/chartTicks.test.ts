import { describe, expect, it } from 'vitest';

import { hourTickLabel, hourTicks } from '@/components/zones/chartTicks';

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
