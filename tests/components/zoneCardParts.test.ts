// A zone card's parts rendered to HTML by react-dom/server through react-native-web, as the web
// bundle renders them: RH above the zone's limit is marked in words (not colour alone), and a
// lumber zone's lead figure is its wood EMC against the Wood Handbook band of its region.
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';

import { EmcLead } from '@/components/zones/EmcLead';
import { MarginBar } from '@/components/zones/MarginBar';
import { ZoneReadings } from '@/components/zones/ZoneReadings';
import { emcTargetBand } from '@/ingest/emcTarget';

const decode = (html: string) =>
  html
    .replace(/&#x27;/g, "'")
    .replace(/&quot;/g, '"')
    .replace(/&amp;/g, '&');

/** The text of every element with this test id, in order. */
function textsOf(html: string, testId: string): string[] {
  const re = new RegExp(`data-testid="${testId}"[^>]*>([^<]*)<`, 'g');
  return [...html.matchAll(re)].map((m) => decode(m[1]!));
}

const latest = (rh: number) => ({
  dewPoint: 17.4,
  surface: 19,
  surfaceSource: 'estimate' as const,
  air: 20,
  rh,
  emc: 18,
  margin: 1.6,
});

const readings = (rh: number, humidRhPct: number, show?: 'emc' | 'margin') =>
  renderToStaticMarkup(
    createElement(ZoneReadings, { latest: latest(rh), unit: 'F', humidRhPct, show }),
  );

describe('RH against the zone limit', () => {
  it('marks 85 % over a 60 % limit with words', () => {
    expect(textsOf(readings(85, 60), 'zone-rh-over')).toEqual(['▲ Over the 60 % limit']);
  });

  // The limit itself is not over it: the humid-air alarm opens above the limit too.
  it.each([60, 45])('leaves %d %% under a 60 %% limit unmarked', (rh) => {
    expect(textsOf(readings(rh, 60), 'zone-rh-over')).toEqual([]);
  });

  it('shows the dew margin as a difference in °F where EMC leads', () => {
    // 1.6 K is +2.9 °F (×1.8, no 32 °F offset).
    expect(textsOf(readings(50, 60, 'margin'), 'zone-margin-small')).toEqual(['+2.9 °F']);
    expect(textsOf(readings(50, 60, 'margin'), 'zone-emc')).toEqual([]);
  });
});

describe('the EMC lead of a lumber zone', () => {
  const lead = (emcPct: number | null, region: 'most' | 'damp_coastal' = 'most') =>
    renderToStaticMarkup(createElement(EmcLead, { emcPct, band: emcTargetBand(region) }));

  // Bands: Wood Handbook 2010 ch. 13, recommended MC of interior wood at installation (from
  // memory): most of the US 6–10 %, damp warm coast 8–13 %.
  it.each([
    [18, 'most', '▲ Above the target band', 'Target 6–10 % · Most of the US'],
    [8.2, 'most', '✓ In the target band', 'Target 6–10 % · Most of the US'],
    [5.1, 'most', '▼ Below the target band', 'Target 6–10 % · Most of the US'],
    [12, 'damp_coastal', '✓ In the target band', 'Target 8–13 % · Damp, warm coast'],
  ] as const)('%d %% in %s: %s', (emc, region, position, target) => {
    const html = decode(lead(emc, region));
    expect(textsOf(html, 'zone-emc-lead')).toEqual([`${emc.toFixed(1)} %`]);
    expect(html).toContain(position);
    expect(html).toContain(target);
    expect(textsOf(html, 'zone-emc-source')[0]).toMatch(/Wood Handbook.*ch\. 13/);
  });

  it('shows a dash and no position without an EMC', () => {
    const html = decode(lead(null));
    expect(textsOf(html, 'zone-emc-lead')).toEqual(['—']);
    expect(html).not.toMatch(/target band/);
  });
});

// The bar's limit marks are dew-margin differences: in °F they scale by 1.8 with no offset
// (1 K = 1.8 °F) and say their unit, so "5.4" is never read as a bare number or an air temperature.
describe('the margin bar in the reader’s unit', () => {
  it('labels the wet and caution limits in °F', () => {
    const html = renderToStaticMarkup(
      createElement(MarginBar, { marginK: 2, wetK: 1, cautionK: 3, unit: 'F' }),
    );
    expect(textsOf(html.replace(/<!-- -->/g, ''), 'margin-bar-wet')).toEqual(['1.8 °F']);
    expect(textsOf(html.replace(/<!-- -->/g, ''), 'margin-bar-caution')).toEqual(['5.4 °F']);
  });
});
