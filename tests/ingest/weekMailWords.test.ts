import { describe, expect, it } from 'vitest';

import type { ZoneWeekFigures } from '@/ingest/wire/reports';
import { weekMailSubject, weekSpanWords, weekReportPdfName, zoneWeekLine } from '@/ingest/words';

describe('the week in words', () => {
  // Calendar: 1 January 2026 is a Thursday, so 23 March and 28 December 2026 are Mondays.
  it.each([
    ['2026-03-23', 'Mon 23 Mar – Sun 29 Mar 2026'],
    ['2026-03-30', 'Mon 30 Mar – Sun 5 Apr 2026'],
    ['2026-12-28', 'Mon 28 Dec – Sun 3 Jan 2027'],
  ])('the week of %s is %s', (weekStart, words) => {
    expect(weekSpanWords(weekStart)).toBe(words);
  });

  it('names the shop and the week in the subject, and dates the PDF by its Monday', () => {
    expect(weekMailSubject('Tamarack Street Joinery', '2026-11-23')).toBe(
      'Week report: Tamarack Street Joinery, Mon 23 Nov – Sun 29 Nov 2026',
    );
    expect(weekReportPdfName('2026-11-23')).toBe('drybench-week-2026-11-23.pdf');
  });
});

/** A zone's figures with only what the line reads set to something meaningful. */
function zone(overrides: Partial<ZoneWeekFigures>): ZoneWeekFigures {
  const none = { min: null, mean: null, max: null };
  return {
    zoneId: 'z',
    name: 'Machine room',
    purpose: 'machines',
    readings: 0,
    coveragePct: 0,
    airC: none,
    rhPct: none,
    emcPct: none,
    lowestMargin: null,
    levelHours: { dry: 0, close: 0, wet: 0, unknown: 168 },
    timeOfWetness: { hours: 0, annualHours: null, category: null },
    alarms: {
      opened: 0,
      openedByKind: { dew_risk: 0, wet_surface: 0, humid_air: 0, sensor_silent: 0, battery_low: 0 },
      acknowledged: 0,
      medianAckMinutes: null,
      longestAckMinutes: null,
      unacknowledged: 0,
    },
    silentPeriods: [],
    verdict: '',
    ...overrides,
  };
}

describe('a zone’s line', () => {
  const wet = zone({
    name: 'Bench room',
    coveragePct: 97.6,
    // 2026-11-03T12:10Z is 06:10 CST (UTC-6) on Tuesday 3 November in Chicago.
    lowestMargin: { marginK: -0.5, at: '2026-11-03T12:10:00.000Z' },
    levelHours: { dry: 150, close: 15.5, wet: 2.5, unknown: 1 },
  });

  it.each([
    // A dew margin is a difference: °F = K × 1.8, no offset (-0.5 K → -0.9 °F).
    ['C', 'Bench room: lowest dew margin -0.5 °C (Tue 3 Nov 06:10), wet 2.5 h, data 98 %'],
    ['F', 'Bench room: lowest dew margin -0.9 °F (Tue 3 Nov 06:10), wet 2.5 h, data 98 %'],
  ] as const)('in °%s', (unit, line) => {
    expect(zoneWeekLine(wet, unit, 'America/Chicago')).toBe(line);
  });

  it('says so when the zone sent nothing all week', () => {
    expect(zoneWeekLine(zone({}), 'C', 'Europe/Berlin')).toBe(
      'Machine room: no dew margin measured, wet 0 h, data 0 %',
    );
  });
});
