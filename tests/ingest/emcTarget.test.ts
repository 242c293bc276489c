import { describe, expect, it } from 'vitest';

import { emcPct } from '../../ingest/emc';
import { emcBandPosition, emcTargetBand } from '../../ingest/emcTarget';
import { EMC_TARGET_SOURCE } from '../../ingest/words/zones';
import { EMC_REGIONS } from '../../ingest/wire/zones';

/**
 * USDA FPL Wood Handbook (FPL-GTR-190, 2010), chapter 13, table of recommended moisture content
 * values for wood items at time of installation, interior use (the number, 13-1 or 13-2, to be
 * checked against the book). Values QUOTED FROM MEMORY, not read off the page:
 * most areas of the US 8 % (6–10 %), dry southwest 6 % (4–9 %), damp warm coast 11 % (8–13 %).
 */
const TABLE: [region: (typeof EMC_REGIONS)[number], average: number, low: number, high: number][] =
  [
    ['most', 8, 6, 10],
    ['dry_southwest', 6, 4, 9],
    ['damp_coastal', 11, 8, 13],
  ];

describe('target band by region (Wood Handbook ch. 13, interior, from memory)', () => {
  it.each(TABLE)('%s: average %d %%, pieces %d–%d %%', (region, average, low, high) => {
    expect(emcTargetBand(region)).toEqual({
      region,
      averagePct: average,
      lowPct: low,
      highPct: high,
    });
  });

  it('has a band for every region the API accepts, each around its average', () => {
    for (const region of EMC_REGIONS) {
      const band = emcTargetBand(region);
      expect(band.lowPct).toBeLessThan(band.averagePct);
      expect(band.averagePct).toBeLessThan(band.highPct);
    }
  });

  it('names the table it comes from', () => {
    expect(EMC_TARGET_SOURCE).toMatch(/Wood Handbook/);
    expect(EMC_TARGET_SOURCE).toMatch(/ch\. 13/);
  });
});

describe('an EMC against the band', () => {
  const most = emcTargetBand('most');
  // The edges of the band and just past them: the bounds belong to the band.
  it.each([
    [5.9, 'below'],
    [6, 'in'],
    [8, 'in'],
    [10, 'in'],
    [10.01, 'above'],
    [18, 'above'],
  ] as const)('%d %% in most of the US → %s', (emc, position) => {
    expect(emcBandPosition(emc, most)).toBe(position);
  });

  it.each([null, undefined, Number.NaN, Infinity])('%s gives no position', (emc) => {
    expect(emcBandPosition(emc, most)).toBeNull();
  });

  it('the same EMC is in band on the damp coast and above it in the dry southwest', () => {
    expect(emcBandPosition(12, emcTargetBand('damp_coastal'))).toBe('in');
    expect(emcBandPosition(12, emcTargetBand('dry_southwest'))).toBe('above');
  });

  // A lumber rack at 85 % RH: at 20 °C the Wood Handbook's eq. 4-5 (ingest/emc.ts, checked
  // against its Table 4-2 in emc.test.ts) gives 18.0 %, far above every region's band.
  it('air at 20 °C and 85 % RH puts wood above the band in every region', () => {
    const emc = emcPct(20, 85);
    expect(emc).toBeGreaterThan(17);
    for (const region of EMC_REGIONS) {
      expect(emcBandPosition(emc, emcTargetBand(region))).toBe('above');
    }
  });
});
