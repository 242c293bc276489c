import { describe, expect, it } from 'vitest';

import { marginScale } from '@/components/zones/marginScale';

describe('marginScale', () => {
  it('puts the limits at thirds and clamps the marker', () => {
    const scale = marginScale(2, 1, 3);
    expect(scale.wetAt).toBeCloseTo(1 / 3);
    expect(scale.cautionAt).toBeCloseTo(2 / 3);
    expect(scale.markerAt).toBeCloseTo(0.5);
    expect(marginScale(25, 1, 3).markerAt).toBe(1);
    expect(marginScale(-4, 1, 3).markerAt).toBe(0);
    expect(marginScale(null, 1, 3).markerAt).toBeNull();
  });
});
