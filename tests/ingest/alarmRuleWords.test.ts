// The words of alarms people read (ingest/words): limits and margins as dew-margin differences
// in the reader's unit, level words in sentence case, and the open/clear rules built from the
// engine's own numbers (ingest/alarmRules.ts) so the text cannot drift from what the engine does.
import { describe, expect, it } from 'vitest';

import { ALARM_KIND_LEVEL, ALARM_KINDS } from '../../ingest/alarmKinds';
import { ALARM_RULE_NUMBERS } from '../../ingest/alarmRules';
import { fDeltaToK, kToFDelta } from '../../ingest/units';
import { LEVELS } from '../../ingest/wire/levels';
import {
  ALARM_KIND_WORDS,
  alarmLevelWord,
  alarmNowAndWorst,
  alarmRule,
  alarmsSummaryLine,
  formatDelta,
  formatDuration,
  LEVEL_WORDS,
  limitLabels,
  limitsSentence,
  type AlarmFacts,
} from '../../ingest/words';
import { ALARM_RULES } from '../../server/alarms/rules';

// A difference in °F is the difference in K × 1.8 with no 32 °F offset: the Fahrenheit degree
// is 5/9 of a kelvin by definition (NIST SP 811, 2008, B.8, "degree Fahrenheit").
describe('limits are differences of the dew margin', () => {
  it.each([
    [3, 'C', '3 °C'],
    [3, 'F', '5.4 °F'],
    [1, 'F', '1.8 °F'],
    [0.5, 'F', '0.9 °F'],
    [3.5, 'C', '3.5 °C'],
    [-1, 'F', '-1.8 °F'],
  ] as const)('%s K in °%s reads "%s"', (k, unit, text) => {
    expect(formatDelta(k, unit)).toBe(text);
  });

  it('round-trips a limit typed in °F back to the same kelvin (×/÷ 1.8, no offset)', () => {
    for (const k of [0.5, 1, 2.2, 3, 4.75]) expect(fDeltaToK(kToFDelta(k))).toBeCloseTo(k, 12);
    // 5.4 °F typed in the form is 3 K, not (5.4 − 32) / 1.8.
    expect(fDeltaToK(5.4)).toBeCloseTo(3, 12);
  });

  it('labels the form fields as dew-margin differences, never a bare unit before a number', () => {
    const labels = limitLabels('F');
    expect(labels.caution).toBe('Caution when the dew margin is below (°F difference)');
    expect(labels.wet).toBe('Wet when the dew margin is at or below (°F difference)');
    expect(limitsSentence({ cautionK: 3, wetK: 1, humidRhPct: 60 }, 'F')).toBe(
      'Caution when the dew margin is below 5.4 °F; wet when it is at or below 1.8 °F; humid when the relative humidity is above 60 %.',
    );
    expect(limitsSentence({ cautionK: 3, wetK: 1, humidRhPct: 60 }, 'C')).toContain(
      'below 3 °C; wet when it is at or below 1 °C',
    );
  });
});

describe('level words', () => {
  it.each(LEVELS)('%s is one word in sentence case', (level) => {
    const word = LEVEL_WORDS[level];
    expect(word).toMatch(/^[A-Z][a-z]+$/);
    expect(word.toLowerCase()).toBe(level);
  });

  it.each(ALARM_KINDS)('the kind %s is named in sentence case', (kind) => {
    expect(ALARM_KIND_WORDS[kind]).toMatch(/^[A-Z][a-z]+( [a-z]+)*$/);
  });

  it('gives each dew kind the word of the level whose colour it borrows: wet surface is never close', () => {
    expect(ALARM_KIND_LEVEL.wet_surface).toBe('wet');
    expect(alarmLevelWord('wet_surface')).toBe('Wet');
    expect(alarmLevelWord('dew_risk')).toBe('Close');
    for (const kind of ALARM_KINDS) {
      const word = alarmLevelWord(kind);
      if (word !== null) expect(word).toBe(LEVEL_WORDS[ALARM_KIND_LEVEL[kind]]);
    }
  });
});

const limits = { cautionK: 3, wetK: 1, humidRhPct: 60 };

describe('the open and clear rules', () => {
  it('says the wet rule with the wet limit, the band and the hold the engine uses', () => {
    // Band 0.5 K, 3 readings or 5 min: rules of thumb of ours, stated in ingest/hysteresis.ts.
    expect(alarmRule('wet_surface', limits, 'C')).toEqual({
      opens:
        'Opens when the dew margin is at or below 1 °C (the wet limit) for 3 readings or 5 min, whichever comes first.',
      clears:
        'Clears when the dew margin stays above 1.5 °C for 3 readings or 5 min, whichever comes first.',
      clearsShort: 'Clears when the margin stays above 1.5 °C for 3 readings or 5 min',
    });
    // The same in °F: 1 K = 1.8 °F, 1.5 K = 2.7 °F.
    expect(alarmRule('wet_surface', limits, 'F').clears).toContain('above 2.7 °F');
    expect(alarmRule('wet_surface', limits, 'F').opens).toContain('at or below 1.8 °F');
  });

  it('builds every number from the engine’s constants, so changing one changes the text', () => {
    const n = ALARM_RULE_NUMBERS;
    const dew = alarmRule('dew_risk', limits, 'C');
    expect(dew.opens).toContain(
      `for ${n.level.minCount} readings or ${n.level.minHoldMs / 60_000} min`,
    );
    expect(dew.opens).toContain(`within ${formatDuration(n.lookAheadMs)}`);
    expect(formatDuration(60 * 60_000)).toBe('1 h');
    expect(formatDuration(90 * 60_000)).toBe('90 min');
    expect(dew.clears).toContain(`at or above ${limits.cautionK + n.level.bandK} °C`);
    expect(dew.clears).toContain(`then ${n.warningQuietMs / 60_000} min pass`);
    const humid = alarmRule('humid_air', limits, 'C');
    expect(humid.opens).toContain(`above 60 % for ${n.humid.openHoldMs / 60_000} min`);
    expect(humid.clears).toContain(`at or below ${60 - n.humid.bandPct} %`);
    expect(alarmRule('battery_low', limits, 'C')).toMatchObject({
      opens: `Opens when the battery stays below ${n.battery.lowV.toFixed(2)} V for ${n.battery.openHoldMs / 60_000} min.`,
      clears: `Clears when it stays at or above ${(n.battery.lowV + n.battery.bandV).toFixed(2)} V for ${n.battery.clearHoldMs / 60_000} min.`,
    });
    expect(alarmRule('sensor_silent', limits, 'C').opens).toContain(`${n.silentFactor} of its`);
  });

  it('uses the very numbers the engine steps with', () => {
    expect(ALARM_RULES.level).toBe(ALARM_RULE_NUMBERS.level);
    expect(ALARM_RULES.humid).toBe(ALARM_RULE_NUMBERS.humid);
    expect(ALARM_RULES.battery).toBe(ALARM_RULE_NUMBERS.battery);
    expect(ALARM_RULES.warningQuietMs).toBe(ALARM_RULE_NUMBERS.warningQuietMs);
    expect(ALARM_RULES.lookAheadMs).toBe(ALARM_RULE_NUMBERS.lookAheadMs);
    expect(ALARM_RULES.silent.factor).toBe(ALARM_RULE_NUMBERS.silentFactor);
  });
});

const wet: AlarmFacts = {
  kind: 'wet_surface',
  cleared: false,
  zoneName: 'Machine room',
  sensorName: null,
  minutesToWet: null,
  worstMarginK: -2.7,
  latestMarginK: -2.7,
  peakRhPct: null,
  latestRhPct: null,
  lowestBatteryV: null,
  latestBatteryV: null,
};

describe('now beside the worst', () => {
  it('says the current margin and level, then the worst, in the reader’s unit', () => {
    const now = { marginK: 8.3, level: 'dry' as const, rhPct: 48 };
    expect(alarmNowAndWorst(wet, now, 'C')).toBe('Now margin +8.3 °C, dry · worst margin -2.7 °C');
    // 8.3 K × 1.8 = 14.94 °F; −2.7 K × 1.8 = −4.86 °F.
    expect(alarmNowAndWorst(wet, now, 'F')).toBe('Now margin +14.9 °F, dry · worst margin -4.9 °F');
    expect(alarmNowAndWorst(wet, null, 'F')).toBe('Worst margin -4.9 °F');
  });

  it('sums the banner up in one line, the worst first', () => {
    const silent = { ...wet, kind: 'sensor_silent' as const, sensorName: 'Saw probe' };
    expect(alarmsSummaryLine([wet, silent])).toBe('2 alarms — Machine room wet');
    expect(alarmsSummaryLine([silent])).toBe('1 alarm — Saw probe silent');
    expect(alarmsSummaryLine([])).toBeNull();
  });
});
