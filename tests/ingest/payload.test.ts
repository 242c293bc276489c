import { describe, expect, it } from 'vitest';

import {
  batchSchema,
  checkReading,
  MAX_FUTURE_MS,
  parseEnvelope,
  singleSchema,
  type RejectCode,
} from '../../ingest/payload';

// A fixed "server clock", so the future edge is exact to the millisecond.
const NOW_MS = Date.UTC(2026, 2, 2, 6, 10, 0);

/** The code the contract's per-reading check gives a reading sent with this `at`, or null. */
function verdict(at: string | number): RejectCode | null {
  const envelope = parseEnvelope({ at, air: 12, rh: 60 }, NOW_MS);
  if (!envelope.ok) throw new Error(`envelope refused: ${JSON.stringify(envelope.issues)}`);
  return checkReading(envelope.readings[0]!, NOW_MS)?.code ?? null;
}

describe('the time checks of a reading', () => {
  // The edges are the contract's (shared/API.md): `at` before 2000-01-01 or more than
  // 5 minutes ahead of the server clock is rejected.
  it.each<[string, string | number, RejectCode | null]>([
    ['one second before 2000', '1999-12-31T23:59:59Z', 'time_too_early'],
    ['one ms before 2000', '1999-12-31T23:59:59.999Z', 'time_too_early'],
    ['2000-01-01 exactly', '2000-01-01T00:00:00Z', null],
    ['2000-01-01 in epoch seconds', 946684800, null],
    ['one second before 2000 in epoch seconds', 946684799, 'time_too_early'],
    ['now', new Date(NOW_MS).toISOString(), null],
    ['now + 5 min exactly', new Date(NOW_MS + MAX_FUTURE_MS).toISOString(), null],
    ['now + 5 min + 1 ms', new Date(NOW_MS + MAX_FUTURE_MS + 1).toISOString(), 'time_in_future'],
    ['year 1 as ISO', '0001-01-01T00:00:00Z', 'time_too_early'],
    ['year 1 in epoch seconds', -62167219200, 'time_too_early'],
    ['epoch 0 (a clock that lost power)', 0, 'time_too_early'],
    ['-1e20 epoch seconds', -1e20, 'time_too_early'],
    ['1e20 epoch seconds', 1e20, 'time_in_future'],
    ['1e306 epoch seconds (Infinity in ms)', 1e306, 'invalid_time'],
    ['-1e306 epoch seconds', -1e306, 'invalid_time'],
    ['an impossible calendar date', '2026-02-30T25:61:00Z', 'invalid_time'],
  ])('%s → %s', (_name, at, code) => {
    expect(verdict(at)).toBe(code);
  });

  it('tells the person what to do about an early time', () => {
    const envelope = parseEnvelope({ at: '1970-01-01T00:00:00Z', air: 12, rh: 60 }, NOW_MS);
    if (!envelope.ok) throw new Error('envelope refused');
    expect(checkReading(envelope.readings[0]!, NOW_MS)?.message).toMatch(/sensor clock/);
  });
});

describe('fields the contract does not name', () => {
  // shared/API.md: a field the contract does not name is refused with `unknown_field`, so a
  // misspelt `surface` never passes as a reading without a probe.
  it.each<[string, Record<string, unknown>, string[]]>([
    ['a misspelt surface', { air: 12, rh: 80, surfce: 5 }, ['surfce']],
    ['"temp" for air', { temp: 12, air: 12, rh: 80 }, ['temp']],
    ['an extra nested key', { air: 12, rh: 80, meta: { surface: 5 } }, ['meta']],
    ['two at once', { air: 12, rh: 80, surfce: 5, batery: 3 }, ['surfce', 'batery']],
  ])('refuses a single reading with %s, naming each field', (_name, body, fields) => {
    const envelope = parseEnvelope(body, NOW_MS);
    expect(envelope).toMatchObject({ ok: false, code: 'unknown_field' });
    if (envelope.ok) return;
    expect(envelope.issues.map((i) => i.path)).toEqual(fields);
    envelope.issues.forEach((issue, i) => expect(issue.message).toContain(`"${fields[i]}"`));
  });

  it('refuses an unknown key beside the readings of a batch (a misspelt unit changes every value)', () => {
    const envelope = parseEnvelope({ unti: 'F', readings: [{ air: 50, rh: 50 }] }, NOW_MS);
    expect(envelope).toMatchObject({
      ok: false,
      code: 'unknown_field',
      issues: [{ path: 'unti' }],
    });
  });

  it('in a batch refuses only the reading at fault, naming its field', () => {
    const envelope = parseEnvelope(
      {
        readings: [
          { air: 12, rh: 80, surface: 5 },
          { air: 12, rh: 80, surfce: 5 },
        ],
      },
      NOW_MS,
    );
    if (!envelope.ok) throw new Error('envelope refused');
    const verdicts = envelope.readings.map((r) => checkReading(r, NOW_MS));
    expect(verdicts[0]).toBeNull();
    expect(verdicts[1]).toMatchObject({ code: 'unknown_field', field: 'surfce' });
    expect(verdicts[1]?.message).toContain('"surfce"');
  });

  it('accepts every field the contract names, with the unit beside them', () => {
    const envelope = parseEnvelope(
      { unit: 'C', at: '2026-03-02T06:00:00Z', air: 12, rh: 80, surface: 5, battery: 3 },
      NOW_MS,
    );
    expect(envelope.ok).toBe(true);
    if (envelope.ok) expect(checkReading(envelope.readings[0]!, NOW_MS)).toBeNull();
  });
});

describe('the fast check of the common shapes agrees with the schema', () => {
  // parseEnvelope reads the shapes nearly every sensor posts without zod; zod's schemas
  // (batchSchema, singleSchema) stay the contract, so every body here must get zod's verdict.
  const single = (body: Record<string, unknown>) => body;
  const bodies: [string, unknown][] = [
    ['plain single', single({ at: '2026-03-02T06:10:00Z', air: 12, rh: 60 })],
    [
      'single with probe and battery',
      single({ at: 1772431800, air: 12, rh: 60, surface: 10, battery: 3.1 }),
    ],
    ['single in °F', single({ air: 68, rh: 50, unit: 'F', surface: null, battery: null })],
    ['single without a time', single({ air: 12, rh: 60 })],
    ['air as a string', single({ air: '12', rh: 60 })],
    ['rh missing', single({ air: 12 })],
    ['at without an offset', single({ at: '2026-03-02T06:10:00', air: 12, rh: 60 })],
    ['at null', single({ at: null, air: 12, rh: 60 })],
    ['unit K', single({ air: 12, rh: 60, unit: 'K' })],
    ['surface as a string', single({ air: 12, rh: 60, surface: '10' })],
    ['battery false', single({ air: 12, rh: 60, battery: false })],
    ['air NaN (not JSON, but a caller could)', single({ air: Number.NaN, rh: 60 })],
    ['air Infinity', single({ air: Number.POSITIVE_INFINITY, rh: 60 })],
    ['an array', [{ air: 12, rh: 60 }]],
    [
      'plain batch',
      {
        unit: 'C',
        readings: [
          { air: 12, rh: 60 },
          { at: 1772431800, air: 13, rh: 61 },
        ],
      },
    ],
    ['batch without unit', { readings: [{ air: 50, rh: 60, surface: 48 }] }],
    ['batch, empty', { readings: [] }],
    ['batch, readings not an array', { readings: { air: 12, rh: 60 } }],
    [
      'batch, one bad item',
      {
        readings: [
          { air: 12, rh: 60 },
          { air: 'x', rh: 60 },
        ],
      },
    ],
    ['batch, an item not an object', { readings: [{ air: 12, rh: 60 }, 7] }],
    ['batch, unit lower case', { unit: 'f', readings: [{ air: 12, rh: 60 }] }],
  ];

  it.each(bodies)('%s', (_name, body) => {
    const result = parseEnvelope(body, NOW_MS);
    const isBatchBody =
      typeof body === 'object' && body !== null && !Array.isArray(body) && 'readings' in body;
    const zod = isBatchBody ? batchSchema.safeParse(body) : singleSchema.safeParse(body);
    expect(result.ok).toBe(zod.success);
    if (!result.ok || !zod.success) return;
    const unit = zod.data.unit;
    const raw = 'readings' in zod.data ? zod.data.readings : [zod.data];
    const toC = (v: number) => (unit === 'F' ? ((v - 32) * 5) / 9 : v);
    expect(result.readings).toEqual(
      raw.map((r) => ({
        atMs:
          typeof r.at === 'number'
            ? Math.round(r.at * 1000)
            : typeof r.at === 'string'
              ? Date.parse(r.at)
              : NOW_MS,
        airC: toC(r.air),
        rhPct: r.rh,
        surfaceC: r.surface == null ? null : toC(r.surface),
        batteryV: r.battery ?? null,
      })),
    );
  });

  it('reads 68 °F as 20 °C (the Fahrenheit scale: °C = (°F − 32) × 5/9)', () => {
    const result = parseEnvelope({ air: 68, rh: 50, unit: 'F' }, NOW_MS);
    expect(result.ok && result.readings[0]!.airC).toBeCloseTo(20, 12);
  });

  it('words a refusal exactly as the schema does', () => {
    const body = { at: '2026-03-02T06:10:00', air: 12, rh: 60 };
    const result = parseEnvelope(body, NOW_MS);
    const zod = singleSchema.safeParse(body);
    expect(result.ok).toBe(false);
    expect(!result.ok && result.issues).toEqual(
      !zod.success && zod.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })),
    );
  });
});
