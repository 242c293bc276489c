// The week report's words: every figure's label names its unit in the reader's scale, the
// verdicts read the figures correctly, and advice to warm or dry comes with its cautions.
import { describe, expect, it } from 'vitest';

import type { ShopWeekFigures, ZoneWeekFigures } from '@/ingest/wire/reports';
import { CAUTIONS } from '@/ingest/words/advice';
import { REPORT_COLUMNS, shopVerdict, zoneVerdict } from '@/ingest/words/report';

const none = { min: null, mean: null, max: null };
const zone = (
  over: Partial<Omit<ZoneWeekFigures, 'verdict'>> = {},
): Omit<ZoneWeekFigures, 'verdict'> => ({
  zoneId: 'z1',
  name: 'Machine room',
  purpose: 'machines',
  readings: 2016,
  coveragePct: 100,
  airC: { min: 4, mean: 9, max: 15 },
  rhPct: { min: 50, mean: 70, max: 92 },
  emcPct: none,
  lowestMargin: { marginK: -0.5, at: '2026-03-24T05:10:00.000Z' },
  levelHours: { dry: 160, close: 5.5, wet: 2.5, unknown: 0 },
  timeOfWetness: { hours: 12, annualHours: 624, category: 't3' },
  alarms: {
    opened: 2,
    openedByKind: { dew_risk: 1, wet_surface: 1, humid_air: 0, sensor_silent: 0, battery_low: 0 },
    acknowledged: 2,
    medianAckMinutes: 12,
    longestAckMinutes: 20,
    unacknowledged: 0,
  },
  silentPeriods: [],
  ...over,
});

describe('report column labels', () => {
  it('name the unit of every figure in the reader’s scale', () => {
    const labels = (unit: 'C' | 'F') => REPORT_COLUMNS.map((c) => c.label(unit));
    for (const label of labels('F').filter((l) => /Air (min|mean|max)/.test(l))) {
      expect(label).toMatch(/\(°F\)$/);
    }
    expect(labels('C')).toContain('Lowest dew margin (°C difference)');
    expect(labels('F')).toContain('Lowest dew margin (°F difference)');
    // ISO 9223's time of wetness is named as such, with its unit.
    expect(
      labels('C').filter((l) => /wetness/i.test(l) && /ISO 9223/.test(l) && /\(h\)$/.test(l)),
    ).toHaveLength(1);
    // Every number column but counts carries a unit in brackets.
    const counts = /Readings|alarms opened|Alarms|Silent periods/;
    for (const c of REPORT_COLUMNS.filter((c) => c.kind === 'number')) {
      if (!counts.test(c.label('C'))) expect(c.label('C'), c.key).toMatch(/\((°C|%|h|min)[^)]*\)$/);
    }
  });
});

describe('zone verdicts', () => {
  it('say how far below the dew point, when (shop time) and for how long', () => {
    // 05:10Z on Tuesday 2026-03-24 is 06:10 in Berlin (CET, +01).
    const text = zoneVerdict(zone(), 'C', 'Europe/Berlin');
    expect(text).toContain('The iron went 0.5 °C below the dew point on Tuesday at 06:10');
    expect(text).toContain('wet for 2.5 h');
    expect(text).toContain('2 alarms, answered in 12 min at the median.');
    // 0.5 K is 0.9 °F as a difference (×1.8, no offset).
    expect(zoneVerdict(zone(), 'F', 'Europe/Berlin')).toContain('0.9 °F below the dew point');
  });

  it('never call a silent zone dry', () => {
    const text = zoneVerdict(
      zone({ readings: 0, coveragePct: 0, lowestMargin: null, airC: none, rhPct: none }),
      'C',
      'UTC',
    );
    expect(text).toContain('No readings from Machine room');
    expect(text).not.toMatch(/stayed dry/);
  });

  it('name the silent periods when coverage is short', () => {
    const text = zoneVerdict(
      zone({
        coveragePct: 80,
        silentPeriods: [
          { from: '2026-03-24T00:00:00.000Z', to: '2026-03-24T20:00:00.000Z', hours: 20 },
          { from: '2026-03-25T00:00:00.000Z', to: '2026-03-25T13:36:00.000Z', hours: 13.6 },
        ],
      }),
      'C',
      'UTC',
    );
    expect(text).toContain('Readings covered 80 % of the time (2 silent periods, 33.6 h).');
  });
});

describe('lumber zones', () => {
  it('speak of the surface, not the iron, and of the wood’s EMC, from the figures given', () => {
    const text = zoneVerdict(
      zone({ purpose: 'lumber', emcPct: { min: 9.1, mean: 10.84, max: 12.4 } }),
      'C',
      'UTC',
    );
    expect(text).toMatch(/^The surface went 0\.5 °C below the dew point/);
    expect(text).toContain('stored wood to 10.8 % moisture on average (EMC 9.1 % to 12.4 %)');
  });
});

describe('shop verdict', () => {
  const shop = (over: Partial<Omit<ShopWeekFigures, 'verdict'>> = {}) => ({
    zones: 2,
    coveragePct: 99,
    lowestMargin: {
      zoneId: 'z1',
      zoneName: 'Machine room',
      marginK: 4,
      at: '2026-03-24T05:10:00.000Z',
    },
    zonesWet: 0,
    wetHours: 0,
    closeHours: 0,
    alarmsOpened: 0,
    medianAckMinutes: null,
    unacknowledged: 0,
    ...over,
  });

  it('suggests warming or drying only with the heater and dehumidifier cautions', () => {
    const wet = shopVerdict(shop({ zonesWet: 1, wetHours: 2.5, closeHours: 3 }), 'C', 'UTC');
    expect(wet).toContain('dry the air');
    expect(wet).toContain(CAUTIONS.fuelHeaters);
    expect(wet).toContain(CAUTIONS.appliancesAndCodes);
    const silent = shopVerdict(shop({ coveragePct: 0, lowestMargin: null }), 'C', 'UTC');
    expect(silent).toContain('the shop cannot be called dry');
    expect(silent).not.toContain('No iron was wet');
    expect(shopVerdict(shop({ coveragePct: 60 }), 'C', 'UTC')).toContain(
      'No iron was wet or close while the sensors reported.',
    );
    const dry = shopVerdict(shop(), 'C', 'UTC');
    expect(dry).toContain('No iron was wet or close.');
    expect(dry).not.toContain('heater');
  });
});
