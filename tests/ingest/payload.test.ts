import { describe, expect, it } from 'vitest';

import { checkReading, MAX_FUTURE_MS, parseEnvelope, type RejectCode } from '../../ingest/payload';

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
