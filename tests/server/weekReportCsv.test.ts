// The week report as CSV: it parses back (papaparse) to the JSON figures in the reader's unit,
// names each column with its unit, and keeps zone names that look like formulas as text.
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, type TestApp } from '../support/app';
import { fahrenheitShopWithSixReadings } from '../support/weekReports';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
});
afterAll(() => t.pool.end());

describe('week report CSV', () => {
  it('parses back to the JSON figures in °F, with formula-like names neutralised', async () => {
    const hyperlink = '=HYPERLINK("http://example.com","Click")';
    // Week of Monday 2026-06-15 (UTC shop). Air 10 °C at RH 100 % has its dew point at 10 °C, so a
    // 13 °C surface is exactly 3 K above it: 5.4 °F as a difference (×1.8, no offset). Air 20 °C
    // is 68 °F (×1.8 + 32). Six readings 10 min apart: 5 × 10 + 15 (the cap, for the last) = 65 min covered.
    const o = await fahrenheitShopWithSixReadings(t, {
      name: 'Tamarack',
      timeZone: 'UTC',
      zones: [hyperlink, '-1+2'],
      firstAt: '2026-06-16T06:00:00Z',
    });
    const shopId = o.shopId;

    const path = `/api/v1/shops/${shopId}/reports/week?start=2026-06-15`;
    const json = (await o.agent.get(path).expect(200)).body;
    const res = await o.agent.get(`${path}&format=csv`).expect(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe(
      'attachment; filename="drybench-week-2026-06-15.csv"',
    );
    // RFC 4180 line ends: every line ends in CRLF, no bare LF.
    expect(res.text.endsWith('\r\n')).toBe(true);
    expect(res.text.replace(/\r\n/g, '')).not.toContain('\n');

    const rows = Papa.parse<string[]>(res.text.trimEnd(), { newline: '\r\n' }).data;
    const [header, shopRow, row1, row2] = rows;
    expect(rows).toHaveLength(4);
    const col = (label: string) => {
      const i = header!.indexOf(label);
      expect(i, label).toBeGreaterThanOrEqual(0);
      return i;
    };
    expect(header!.some((h) => /wetness/i.test(h) && h.includes('ISO 9223'))).toBe(true);
    expect(shopRow![0]).toBe('Whole shop (all zones)');

    // Text cells that a spreadsheet would run are prefixed with a quote (OWASP CSV injection).
    expect(row1![col('Zone')]).toBe(`'${hyperlink}`);
    expect(row2![col('Zone')]).toBe("'-1+2");

    const z = json.zones[0];
    const n = (row: string[], label: string) => Number(row[col(label)]);
    // Hand values: air min 10 °C = 50 °F, max 20 °C = 68 °F; lowest margin 3 K = 5.4 °F.
    expect(n(row1!, 'Air min (°F)')).toBe(50);
    expect(n(row1!, 'Air max (°F)')).toBe(68);
    expect(n(row1!, 'Lowest dew margin (°F difference)')).toBe(5.4);
    expect(n(shopRow!, 'Lowest dew margin (°F difference)')).toBe(5.4);
    expect(row1![col('Lowest dew margin at (shop time)')]).toBe('2026-06-16 06:00');
    // Air mean (10·30 + 20·35) / 65 °C in °F, to the CSV's 3 decimals.
    expect(n(row1!, 'Air mean (°F)')).toBeCloseTo(((10 * 30 + 20 * 35) / 65) * 1.8 + 32, 3);
    // The rest as the JSON says (unitless or already in %, h, min), to 3 decimals.
    const same: [string, number | null][] = [
      ['Data coverage (%)', z.coveragePct],
      ['RH mean (%)', z.rhPct.mean],
      ['Dry (h)', z.levelHours.dry],
      ['Unknown or no data (h)', z.levelHours.unknown],
      ['Time of wetness, ISO 9223: RH > 80 % and air > 0 °C (h)', z.timeOfWetness.hours],
      ['Readings', z.readings],
      ['Alarms opened', z.alarms.opened],
    ];
    for (const [label, value] of same) expect(n(row1!, label), label).toBeCloseTo(value!, 3);
    // Hand values for those: 65 min covered of 168 h; 30 min of RH 100 % at 10 °C is wet.
    expect(n(row1!, 'Data coverage (%)')).toBeCloseTo((65 / (168 * 60)) * 100, 3);
    expect(n(row1!, 'Time of wetness, ISO 9223: RH > 80 % and air > 0 °C (h)')).toBe(0.5);
    // The empty zone: no figures, empty cells rather than zeros.
    expect(row2![col('Air min (°F)')]).toBe('');
    expect(n(row2!, 'Unknown or no data (h)')).toBe(168);
  });
});
