// The words shared by the app and the alarm e-mails (ingest/words): the dew/frost point label at
// the switch psychrometrics.ts uses, the number formats in °C and °F, the alarm headlines, and the
// advice with its safety cautions.
import { describe, expect, it } from 'vitest';

import { ALARM_KINDS, type AlarmKind } from '../../ingest/alarmKinds';
import { dewPoint } from '../../ingest/psychrometrics';
import {
  aboutMinutes,
  ALARM_ADVICE,
  alarmHeadline,
  dewPointLabel,
  dewPointSeriesLabel,
  formatMargin,
  formatTemperature,
  type AlarmFacts,
} from '../../ingest/words';

// The frost point is the saturation temperature over ice, below the triple point (0.01 °C,
// 611.657 Pa) where ASHRAE Handbook — Fundamentals 2017, ch. 1, eq. 5 (ice) and eq. 6 (water),
// the Hyland–Wexler (1983) formulation, meet; ingest/psychrometrics.ts switches there.
describe('dew point or frost point', () => {
  it.each([
    [20, 'dew point'],
    [0.02, 'dew point'],
    [0.01, 'dew point'], // the triple point itself: both curves give the same temperature
    [0.0099, 'frost point'],
    [0, 'frost point'],
    [-7.02, 'frost point'],
    [null, 'dew point'],
    [undefined, 'dew point'],
    [Number.NaN, 'dew point'],
  ])('%s °C is a %s', (dewPointC, words) => {
    expect(dewPointLabel(dewPointC)).toBe(words);
  });

  // The label must agree with the branch dewPoint() took, also at 100 % RH around the switch.
  it.each([
    [20, 50, 'water'],
    [0.02, 100, 'water'],
    [0.01, 100, 'water'], // eq. 6 inverted gives 0.01 °C less 7e-14 K here
    [0, 100, 'ice'],
    [-5, 80, 'ice'],
    [-20, 60, 'ice'],
  ])('air %s °C, RH %s %%: over %s', (airC, rhPct, over) => {
    const found = dewPoint(airC, rhPct);
    if (!found.ok) throw new Error('computable by the module’s range');
    expect(found.over).toBe(over);
    expect(dewPointLabel(found.dewPointC)).toBe(over === 'ice' ? 'frost point' : 'dew point');
  });

  it('names a chart line by the points it shows', () => {
    expect(dewPointSeriesLabel([9.3, 4.1])).toBe('dew point');
    expect(dewPointSeriesLabel([-7, -2.5, null])).toBe('frost point');
    expect(dewPointSeriesLabel([-1.2, 0.5])).toBe('dew / frost point');
    expect(dewPointSeriesLabel([])).toBe('dew point');
    expect(dewPointSeriesLabel([null])).toBe('dew point');
  });
});

// 1 °F = 5/9 K by definition: temperatures convert with the 32 °F offset, margins (differences)
// only scale by 1.8 and keep their sign.
describe('one number format for screen and mail', () => {
  it.each([
    [3, 'C', '+3.0 °C'],
    [3, 'F', '+5.4 °F'],
    [-0.5, 'C', '-0.5 °C'],
    [-0.5, 'F', '-0.9 °F'],
    [0.02, 'F', '0.0 °F'], // 0.036 °F: no sign on zero
    [-0.02, 'C', '0.0 °C'], // no "-0.0" flicker
    [null, 'F', '—'],
  ] as const)('margin %s K in %s reads %s', (marginK, unit, text) => {
    expect(formatMargin(marginK, unit)).toBe(text);
  });

  it.each([
    [0, 'F', '32.0 °F'],
    [-7.02, 'C', '-7.0 °C'],
    [-7.02, 'F', '19.4 °F'],
    [20, 'F', '68.0 °F'],
  ] as const)('temperature %s °C in %s reads %s', (valueC, unit, text) => {
    expect(formatTemperature(valueC, unit)).toBe(text);
  });

  it('rounds expected minutes as a person would say them', () => {
    expect([0.2, 7.4, 12, 41.3, 59, 95].map(aboutMinutes)).toEqual([
      'about 1 min',
      'about 7 min',
      'about 10 min',
      'about 40 min',
      'about 60 min',
      'about 1.5 h',
    ]);
  });
});

describe('alarm headlines', () => {
  const facts = (extra: Partial<AlarmFacts>): AlarmFacts => ({
    kind: 'wet_surface',
    cleared: false,
    zoneName: 'Machine room',
    sensorName: null,
    minutesToWet: null,
    worstMarginK: null,
    latestMarginK: -0.5,
    peakRhPct: null,
    latestRhPct: null,
    lowestBatteryV: null,
    latestBatteryV: null,
    ...extra,
  });
  it.each([
    [facts({}), 'C', 'Machine room: wet, margin -0.5 °C'],
    [facts({}), 'F', 'Machine room: wet, margin -0.9 °F'],
    [facts({ kind: 'dew_risk', latestMarginK: 2 }), 'F', 'Machine room: dew risk, margin +3.6 °F'],
    [
      facts({ kind: 'humid_air', latestRhPct: 71.2 }),
      'C',
      'Machine room: humid air since 06:12, 71 % RH',
    ],
    [
      facts({ kind: 'sensor_silent', sensorName: 'Saw probe' }),
      'C',
      'Saw probe silent since 06:12',
    ],
    [
      facts({ kind: 'battery_low', latestBatteryV: 2.6 }),
      'C',
      'A sensor in Machine room: battery low, 2.60 V',
    ],
    [facts({ cleared: true }), 'F', 'Machine room: wet surface'],
  ] as const)('%#: %s', (a, unit, text) => {
    expect(alarmHeadline(a, { unit, since: '06:12' })).toBe(text);
  });
});

/**
 * The safety rule for advice (ours, after the usual cautions of coating products, sprays, oily
 * rags and fuel-burning heaters): whatever a step asks a person to do, the cautions for doing it
 * travel with it. Checked against the words of the steps, so a step added later that has people
 * wipe, coat, warm or dry without its caution fails here.
 */
describe('advice carries its cautions', () => {
  const stepsOf = (kind: AlarmKind) => ALARM_ADVICE[kind].steps.join(' ');
  const cautionsOf = (kind: AlarmKind) => ALARM_ADVICE[kind].cautions.join(' ');
  const WIPES_OR_COATS = /\b(wip|coat|wax|lubric|inhibitor|oil)/i;
  const WARMS_OR_DRIES = /\b(warm|heat|dehumidif|dry the air)/i;

  it('asks for wiping and coating where the iron is wet, warming or drying where it may be', () => {
    expect(stepsOf('wet_surface')).toMatch(WIPES_OR_COATS);
    for (const kind of ['dew_risk', 'humid_air', 'wet_surface'] as const) {
      expect(stepsOf(kind)).toMatch(WARMS_OR_DRIES);
    }
  });

  it.each(ALARM_KINDS)(
    '%s: wiping or coating comes with unplug, label, ventilation and rags',
    (kind) => {
      if (!WIPES_OR_COATS.test(stepsOf(kind))) return;
      const cautions = cautionsOf(kind);
      expect(cautions).toMatch(/switch off and unplug the machine/i);
      expect(cautions).toMatch(/blade or cutterhead/);
      expect(cautions).toMatch(/label and safety data sheet/);
      expect(cautions).toMatch(/ventilate when spraying/i);
      expect(cautions).toMatch(/aerosols are flammable/);
      expect(cautions).toMatch(/no flames or running heaters/);
      expect(cautions).toMatch(/oily rags can self-heat and catch fire/i);
      expect(cautions).toMatch(/lay them flat to dry/);
      expect(cautions).toMatch(/closed metal container with water/);
    },
  );

  it.each(ALARM_KINDS)('%s: warming or drying comes with the fuel-heater caution', (kind) => {
    if (!WARMS_OR_DRIES.test(stepsOf(kind))) return;
    const cautions = cautionsOf(kind);
    expect(cautions).toMatch(/unvented fuel-burning heaters \(propane, kerosene\)/i);
    expect(cautions).toMatch(/moisture and carbon monoxide/);
    expect(cautions).toMatch(/finishing vapours or dust/);
    expect(cautions).toMatch(/as their makers instruct/);
  });

  it.each(ALARM_KINDS)('%s: defers to makers, local codes and licensed electricians', (kind) => {
    const cautions = cautionsOf(kind);
    expect(cautions).toMatch(/maker/);
    expect(cautions).toMatch(/local electrical( and fire)? codes/);
    if (WARMS_OR_DRIES.test(stepsOf(kind)) || WIPES_OR_COATS.test(stepsOf(kind))) {
      expect(cautions).toMatch(/local electrical and fire codes/);
      expect(cautions).toMatch(/licensed electrician/);
    }
  });

  it('keeps steps short enough for a phone card', () => {
    for (const kind of ALARM_KINDS) {
      for (const step of ALARM_ADVICE[kind].steps) expect(step.length).toBeLessThanOrEqual(110);
    }
  });
});
