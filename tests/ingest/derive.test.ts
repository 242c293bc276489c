import fc from 'fast-check';
import psychrolib from 'psychrolib';
import { describe, expect, it } from 'vitest';

import { deriveAir, deriveMargin, deriveReading } from '../../ingest/derive';
import { emcPct } from '../../ingest/emc';
import type { SensorReading } from '../../ingest/payload';

const NOW_MS = Date.parse('2026-03-02T06:10:00Z');
const reading = (over: Partial<SensorReading> = {}): SensorReading => ({
  atMs: NOW_MS,
  airC: 20,
  rhPct: 50,
  surfaceC: 12,
  batteryV: null,
  ...over,
});

describe('deriveAir: the checks and the air values in one step', () => {
  psychrolib.SetUnitSystem(psychrolib.SI);

  it('gives the dew point of the air (psychrolib, ASHRAE 2017 ch. 1, within 0.02 K) and its EMC', () => {
    const verdict = deriveAir(reading(), NOW_MS);
    expect(verdict.ok).toBe(true);
    if (!verdict.ok) return;
    // 20 °C at 50 % RH: about 9.3 °C (psychrolib GetTDewPointFromRelHum).
    expect(verdict.air.dewPointC).toBeCloseTo(psychrolib.GetTDewPointFromRelHum(20, 0.5), 1);
    expect(Math.abs(verdict.air.dewPointC - 9.26)).toBeLessThan(0.05);
    expect(verdict.air.emcPct).toBe(emcPct(20, 50));
  });

  it.each<[string, Partial<SensorReading>, string]>([
    ['RH above 100 %', { rhPct: 100.5 }, 'rh_out_of_range'],
    ['air colder than −60 °C', { airC: -61 }, 'air_out_of_range'],
    ['a time 6 min ahead of the server', { atMs: NOW_MS + 6 * 60_000 }, 'time_in_future'],
    // Hyland–Wexler's ln(0) at RH 0: no vapour, no dew point (ingest/psychrometrics.ts).
    ['RH 0 %', { rhPct: 0 }, 'not_computable'],
  ])('rejects %s with its code, decided in ingest/', (_what, over, code) => {
    const verdict = deriveAir(reading(over), NOW_MS);
    expect(verdict.ok).toBe(false);
    if (verdict.ok) return;
    expect(verdict.rejection.code).toBe(code);
    expect(verdict.rejection.message.length).toBeGreaterThan(10);
  });
});

describe('deriveMargin: the surface against the dew point', () => {
  const air = { dewPointC: 9.26, emcPct: 9.2 };

  // Limits: caution 3 K (ISO 8502-4), wet 1 K (a rule of thumb of the trade; see levels.test.ts).
  it.each<[number | null, number | null, string]>([
    [15, 5.74, 'dry'],
    [12.26, 3, 'dry'],
    [11, 1.74, 'close'],
    [10.26, 1, 'wet'],
    [8, -1.26, 'wet'],
    [null, null, 'unknown'],
  ])('surface %s °C → margin %s K, %s', (surfaceC, marginK, level) => {
    const derived = deriveMargin(air, surfaceC, { cautionK: 3, wetK: 1 });
    if (marginK === null) expect(derived.marginK).toBeNull();
    else expect(derived.marginK).toBeCloseTo(marginK, 9);
    expect(derived.level).toBe(level);
    expect(derived.dewPointC).toBe(air.dewPointC);
    expect(derived.emcPct).toBe(air.emcPct);
  });

  it('agrees with deriveReading for any checked reading (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -40, max: 50, noNaN: true }),
        fc.double({ min: 1, max: 100, noNaN: true }),
        fc.option(fc.double({ min: -40, max: 50, noNaN: true })),
        (airC, rhPct, surfaceC) => {
          const verdict = deriveAir(reading({ airC, rhPct, surfaceC }), NOW_MS);
          if (!verdict.ok) return;
          expect(deriveMargin(verdict.air, surfaceC)).toEqual(
            deriveReading({ airC, rhPct, surfaceC }),
          );
        },
      ),
    );
  });
});
