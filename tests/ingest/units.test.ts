import { describe, expect, it } from 'vitest';

import { cToF, fDeltaToK, fToC, kToFDelta } from '../../ingest/units';

// Fixed points by definition of the scales: water freezes at 0 °C = 32 °F and boils (1 atm) at
// 100 °C = 212 °F; −40 is the same on both. Exact in floating point to 1e-12.
describe('absolute temperatures', () => {
  it.each([
    [0, 32],
    [100, 212],
    [-40, -40],
    [20, 68],
    [-60, -76],
    [85, 185],
  ])('%d °C = %d °F', (valueC, valueF) => {
    expect(cToF(valueC)).toBeCloseTo(valueF, 12);
    expect(fToC(valueF)).toBeCloseTo(valueC, 12);
  });
});

describe('temperature differences scale without the offset', () => {
  // 1 K = 9/5 °F by definition, so the 3 K caution limit is 5.4 °F, not 37.4 °F.
  it.each([
    [3, 5.4],
    [1, 1.8],
    [0.5, 0.9],
    [-2, -3.6],
  ])('%d K = %d °F', (deltaK, deltaF) => {
    expect(kToFDelta(deltaK)).toBeCloseTo(deltaF, 12);
    expect(fDeltaToK(deltaF)).toBeCloseTo(deltaK, 12);
  });
});
