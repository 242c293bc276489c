import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { emcPct } from '../../ingest/emc';
import {
  AIR_MAX_C,
  AIR_MIN_C,
  dewPoint,
  dewPointOverWater,
  RH_FLOOR_PCT,
} from '../../ingest/psychrometrics';

// Properties that follow from the definitions (Td is where the air's vapour pressure saturates;
// RH ≤ 100 % means e ≤ e_s(T)); no table involved. Seeded so a failure can be replayed.
const runs = { numRuns: 2000, seed: 20260302 };
const airC = fc.double({ min: AIR_MIN_C, max: AIR_MAX_C, noNaN: true });
const rhPct = fc.double({ min: RH_FLOOR_PCT, max: 100, noNaN: true });
const rhStepPct = fc.double({ min: 0.001, max: 50, noNaN: true });

function valueOf(result: ReturnType<typeof dewPoint>): number {
  if (!result.ok) throw new Error(`not computable: ${result.reason}`);
  return result.dewPointC;
}

describe('dew point properties (fast-check)', () => {
  it('the dew point over water never exceeds the air temperature', () => {
    fc.assert(
      fc.property(airC, rhPct, (t, rh) => valueOf(dewPointOverWater(t, rh)) <= t),
      runs,
    );
  });

  it('the reported dew/frost point never exceeds air above the triple point', () => {
    // Below 0.01 °C the frost point may exceed the air (see the frost tests); above it, not.
    const warmAirC = fc.double({ min: 0.01, max: AIR_MAX_C, noNaN: true });
    fc.assert(
      fc.property(warmAirC, rhPct, (t, rh) => valueOf(dewPoint(t, rh)) <= t),
      runs,
    );
  });

  it('rises strictly with RH, across the water/ice switch too', () => {
    fc.assert(
      fc.property(airC, rhPct, rhStepPct, (t, rh, step) => {
        const higherRh = Math.min(100, rh + step);
        fc.pre(higherRh - rh >= 0.001);
        expect(valueOf(dewPoint(t, higherRh))).toBeGreaterThan(valueOf(dewPoint(t, rh)));
        expect(valueOf(dewPointOverWater(t, higherRh))).toBeGreaterThan(
          valueOf(dewPointOverWater(t, rh)),
        );
      }),
      runs,
    );
  });

  it('equals the air temperature at 100 % RH (over water; and as reported above 0.01 °C)', () => {
    fc.assert(
      fc.property(airC, (t) => {
        expect(valueOf(dewPointOverWater(t, 100))).toBeCloseTo(t, 9);
        if (t >= 0.01) expect(valueOf(dewPoint(t, 100))).toBeCloseTo(t, 9);
      }),
      runs,
    );
  });

  it('never returns NaN for any input', () => {
    fc.assert(
      fc.property(fc.double(), fc.double(), (t, rh) => {
        const result = dewPoint(t, rh);
        return !result.ok || Number.isFinite(result.dewPointC);
      }),
      runs,
    );
  });
});

describe('EMC properties (fast-check)', () => {
  it('rises with RH at any shop temperature', () => {
    const shopAirC = fc.double({ min: -10, max: 60, noNaN: true });
    const rh = fc.double({ min: 0, max: 99, noNaN: true });
    fc.assert(
      fc.property(shopAirC, rh, rhStepPct, (t, low, step) => {
        const high = Math.min(100, low + step);
        fc.pre(high - low >= 0.001);
        expect(emcPct(t, high)).toBeGreaterThan(emcPct(t, low));
      }),
      runs,
    );
  });
});
