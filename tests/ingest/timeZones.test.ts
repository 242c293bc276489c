// The time-zone list and search behind the shop forms' picker, and the spelling rule the server
// checks with (ingest/timeZones.ts). Zone names are IANA tzdata's, as the runtime's Intl lists them.
import { describe, expect, it } from 'vitest';

import { checkTimeZone, searchTimeZones, timeZoneNames } from '@/ingest/timeZones';

describe('time zones', () => {
  it('lists the runtime’s zones with UTC once', () => {
    const names = timeZoneNames();
    expect(names).toContain('America/Chicago');
    expect(names.filter((n) => n === 'UTC')).toHaveLength(1);
    expect(names.length).toBeGreaterThan(300);
  });

  it.each([
    ['Chicago', 'America/Chicago'],
    ['chicago', 'America/Chicago'],
    ['new york', 'America/New_York'],
    ['America/Chi', 'America/Chicago'],
    ['Dublin', 'Europe/Dublin'],
  ])('finds %s first as %s', (typed, first) => {
    expect(searchTimeZones(timeZoneNames(), typed)[0]).toBe(first);
  });

  it('puts a city that starts with the text before one that only contains it', () => {
    const found = searchTimeZones(['Europe/Berlin', 'America/Lima', 'Asia/Limassol'], 'lim');
    expect(found).toEqual(['America/Lima', 'Asia/Limassol']);
  });

  it('finds nothing for a stranger', () => {
    expect(searchTimeZones(timeZoneNames(), 'Olympus Mons')).toEqual([]);
  });

  it.each([
    ['America/Chicago', { ok: true }],
    ['UTC', { ok: true }],
    ['america/chicago', { ok: false, suggestion: 'America/Chicago' }],
    ['utc', { ok: false, suggestion: 'UTC' }],
    ['Mars/Olympus', { ok: false, suggestion: null }],
    ['', { ok: false, suggestion: null }],
  ])('checks %s', (name, expected) => {
    expect(checkTimeZone(name)).toEqual(expected);
  });
});
