import { describe, expect, it } from 'vitest';

import {
  DEFAULT_LIMITS,
  deriveAir,
  deriveMargin,
  EXAMPLE_READING_C,
  exampleReadingJson,
  intervalWords,
  parseEnvelope,
  READING_FIELD_GUIDE,
  READING_FIELDS,
} from '@/ingest';

const NOW_MS = Date.UTC(2026, 2, 2, 6, 10, 0);

describe('the token screen’s example reading', () => {
  // Dew point of 18 °C at 50 % RH ≈ 7.4 °C (Magnus form, as any psychrometric chart shows);
  // 17 − 7.4 ≈ 9.6 K is above the default caution limit of 3 K, so the level is dry.
  it.each(['C', 'F'] as const)('leaves a new zone dry when sent in °%s', (unit) => {
    const envelope = parseEnvelope(JSON.parse(exampleReadingJson(unit)), NOW_MS);
    if (!envelope.ok) throw new Error(`refused: ${JSON.stringify(envelope.issues)}`);
    const reading = envelope.readings[0]!;
    expect(reading.airC).toBeCloseTo(EXAMPLE_READING_C.air, 1);
    expect(reading.surfaceC).toBeCloseTo(EXAMPLE_READING_C.surface, 1);
    const air = deriveAir(reading, NOW_MS);
    if (!air.ok) throw new Error('example not computable');
    const derived = deriveMargin(air.air, reading.surfaceC, DEFAULT_LIMITS);
    expect(derived.dewPointC).toBeCloseTo(7.4, 0);
    expect(derived.marginK).toBeGreaterThan(DEFAULT_LIMITS.cautionK);
    expect(derived.level).toBe('dry');
  });

  it('uses only fields the contract names, and the guide lists every one of them', () => {
    for (const key of Object.keys(JSON.parse(exampleReadingJson('F')))) {
      expect([...READING_FIELDS, 'unit']).toContain(key);
    }
    expect(READING_FIELD_GUIDE.map((g) => g.field).sort()).toEqual(
      [...READING_FIELDS, 'unit'].sort(),
    );
  });
});

describe('intervals in words', () => {
  it.each([
    [30, 'every 30 s'],
    [60, 'every 1 min'],
    [90, 'every 1 min 30 s'],
    [300, 'every 5 min'],
    [3600, 'every 1 h'],
    [5400, 'every 1 h 30 min'],
  ])('%i s → %s', (s, words) => {
    expect(intervalWords(s)).toBe(words);
  });
});
