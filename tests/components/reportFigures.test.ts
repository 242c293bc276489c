// A zone's week figures as the Report screen writes them, for a reader in °F: every temperature
// converted with °F = °C × 9/5 + 32, the dew margin (a difference) × 1.8 with no offset, times on
// the shop's clock, and each number under the report's own column label (the CSV's header). Expected strings are worked out by hand in
// the comments; the ISO 9223:1992 Table 1 category is checked against the annualised hours.
// Also the file name a download is saved under, read from Content-Disposition (RFC 6266 with
// RFC 8187's UTF-8 `filename*`), and the level-hours bar writing its numbers, not colour alone.
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';

import {
  filenameFromDisposition,
  type ShopWeekFigures,
  type ZoneWeekFigures,
} from '@/components/queries';
import { LevelHoursBar } from '@/components/report/LevelHoursBar';
import {
  FIGURE_SECTIONS,
  SHOP_FIGURE_ROWS,
  shopFigure,
  zoneFigure,
} from '@/components/report/reportFigures';
import { WeekPicker } from '@/components/report/WeekPicker';
import { ZoneWeekCard } from '@/components/report/ZoneWeekCard';

const zone: ZoneWeekFigures = {
  zoneId: '6f1c1d4e-0000-4000-8000-000000000001',
  name: 'Machine room',
  purpose: 'machines',
  readings: 2016,
  coveragePct: 96.4,
  airC: { min: 10, mean: 15, max: 20 },
  rhPct: { min: 60, mean: 72.4, max: 88 },
  emcPct: { min: 11.2, mean: 12.34, max: 15.06 },
  // 05:52 UTC on Tuesday 24 March is 06:52 in Berlin (CET, UTC+1).
  lowestMargin: { marginK: 0.5, at: '2026-03-24T05:52:00.000Z' },
  levelHours: { dry: 150, close: 9.5, wet: 0.5, unknown: 7 },
  // 31.5 h of 167 covered → 31.5 / 167 × 8760 ≈ 1652 h a year: τ3 (250–2500 h, ISO 9223 Table 1).
  timeOfWetness: { hours: 31.5, annualHours: 1652.4, category: 't3' },
  alarms: {
    opened: 3,
    openedByKind: { dew_risk: 2, wet_surface: 1, humid_air: 0, sensor_silent: 0, battery_low: 0 },
    acknowledged: 2,
    medianAckMinutes: 12,
    longestAckMinutes: 150,
    unacknowledged: 1,
  },
  silentPeriods: [
    { from: '2026-03-25T01:00:00.000Z', to: '2026-03-25T02:30:00.000Z', hours: 1.5 },
    { from: '2026-03-27T10:00:00.000Z', to: '2026-03-27T11:00:00.000Z', hours: 1 },
  ],
  verdict: 'Came within +0.9 °F of the dew point on Tuesday morning.',
};

describe('a zone’s figures in °F', () => {
  const figure = (key: string, z: ZoneWeekFigures = zone) =>
    zoneFigure(z, key, 'F', 'Europe/Berlin');

  it('converts temperatures as temperatures and the margin as a difference', () => {
    // 10 / 15 / 20 °C → 50.0 / 59.0 / 68.0 °F, under the report's own column labels.
    expect(['air_min', 'air_mean', 'air_max'].map((key) => figure(key))).toEqual([
      { key: 'air_min', label: 'Air min (°F)', value: '50.0 °F' },
      { key: 'air_mean', label: 'Air mean (°F)', value: '59.0 °F' },
      { key: 'air_max', label: 'Air max (°F)', value: '68.0 °F' },
    ]);
    // 0.5 K × 1.8 = 0.9 °F, never 0.5 × 1.8 + 32, labelled as a difference; Berlin's clock.
    expect(figure('lowest_margin')).toEqual({
      key: 'lowest_margin',
      label: 'Lowest dew margin (°F difference)',
      value: '+0.9 °F',
    });
    expect(figure('lowest_margin_at').value).toBe('2026-03-24 06:52');
  });

  it('writes RH whole, EMC to a tenth, time of wetness with its ISO 9223 category', () => {
    expect(['rh_min', 'rh_mean', 'rh_max'].map((key) => figure(key).value)).toEqual([
      '60 %',
      '72 %',
      '88 %',
    ]);
    expect(['emc_min', 'emc_mean', 'emc_max'].map((key) => figure(key).value)).toEqual([
      '11.2 %',
      '12.3 %',
      '15.1 %',
    ]);
    expect(figure('tow_hours').value).toBe('31.5 h');
    expect(figure('tow_hours').label).toMatch(/wetness/i);
    expect(figure('tow_category').value).toBe('T3');
    expect(figure('coverage').value).toBe('96 %');
    expect(figure('hours_close').value).toBe('9.5 h');
  });

  it('counts alarms by kind, acknowledgement times and silences', () => {
    expect(figure('alarms_opened').value).toBe('3 (2 dew risk, 1 wet surface)');
    // Median 12 min; longest 150 min, in minutes as the "(min)" header says.
    expect(figure('ack_median').value).toBe('12 min');
    expect(figure('ack_longest').label).toBe('Longest time to acknowledge (min)');
    expect(figure('ack_longest').value).toBe('150 min');
    expect(figure('unacknowledged').value).toBe('1');
    // 1.5 h + 1.0 h of silence in two stretches.
    expect(figure('silent_periods').value).toBe('2');
    expect(figure('silent_hours').value).toBe('2.5 h');
  });

  it('shows dashes, not zeros, for what a silent zone never measured', () => {
    const none = { min: null, mean: null, max: null };
    const silent: ZoneWeekFigures = {
      ...zone,
      readings: 0,
      airC: none,
      rhPct: none,
      emcPct: none,
      lowestMargin: null,
      timeOfWetness: { hours: 0, annualHours: null, category: null },
      alarms: { ...zone.alarms, acknowledged: 0, medianAckMinutes: null, longestAckMinutes: null },
    };
    for (const key of ['air_mean', 'rh_max', 'emc_min', 'lowest_margin', 'lowest_margin_at'])
      expect(figure(key, silent).value).toBe('—');
    expect(figure('tow_category', silent).value).toBe('—');
    expect(figure('ack_median', silent).value).toBe('—');
  });

  it('shows every figure a section names', () => {
    for (const key of FIGURE_SECTIONS.flatMap((section) => section.rows.flat()))
      expect(figure(key).value).not.toBe('');
  });

  it('names the whole shop’s figures by the same columns', () => {
    const shop: ShopWeekFigures = {
      zones: 3,
      coveragePct: 88.4,
      lowestMargin: {
        zoneId: zone.zoneId,
        zoneName: 'Machine room',
        marginK: -0.5,
        at: zone.lowestMargin!.at,
      },
      zonesWet: 1,
      wetHours: 0.5,
      closeHours: 9.5,
      alarmsOpened: 3,
      medianAckMinutes: 12,
      unacknowledged: 1,
      verdict: '',
    };
    const rows = SHOP_FIGURE_ROWS.flat().map((key) => shopFigure(shop, key, 'F', 'Europe/Berlin'));
    // −0.5 K below the dew point is −0.9 °F, with the zone named.
    expect(rows[0]).toEqual({
      key: 'lowest_margin',
      label: 'Lowest dew margin (°F difference)',
      value: '-0.9 °F (Machine room)',
    });
    expect(rows.map((r) => r.value)).toEqual([
      '-0.9 °F (Machine room)',
      '2026-03-24 06:52',
      '0.5 h',
      '9.5 h',
      '88 %',
      '3',
      '1',
      '12 min',
    ]);
  });
});

describe('the file name of a download (RFC 6266)', () => {
  it.each([
    {
      header: 'attachment; filename="tamarack-week-2026-03-23.csv"',
      name: 'tamarack-week-2026-03-23.csv',
    },
    { header: 'attachment; filename=week.pdf', name: 'week.pdf' },
    // RFC 6266 §4.3: a recipient prefers filename* (RFC 8187, percent-encoded UTF-8).
    {
      header: `attachment; filename="fallback.pdf"; filename*=UTF-8''S%C3%A4gewerk%20week.pdf`,
      name: 'Sägewerk week.pdf',
    },
    // A path in the name is cut off: a download never names a folder.
    { header: 'attachment; filename="../../etc/passwd"', name: 'passwd' },
    { header: 'attachment', name: null },
    { header: null, name: null },
  ])('$header → $name', ({ header, name }) => {
    expect(filenameFromDisposition(header)).toBe(name);
  });
});

describe('rendered as the web bundle renders it', () => {
  const decode = (html: string) => html.replace(/&#x27;/g, "'").replace(/&amp;/g, '&');

  it('writes every level’s hours beside its colour', () => {
    const html = decode(
      renderToStaticMarkup(createElement(LevelHoursBar, { hours: zone.levelHours })),
    );
    for (const words of ['Dry 150 h', 'Close 9.5 h', 'Wet 0.5 h', 'Unknown 7 h'])
      expect(html).toContain(words);
    // The coloured bar repeats the words, so assistive technology skips it.
    expect(html).toContain('aria-hidden="true"');
  });

  it('says so when a zone sent nothing in the week', () => {
    const html = renderToStaticMarkup(
      createElement(ZoneWeekCard, {
        shopId: 's',
        zone: { ...zone, readings: 0, levelHours: { dry: 0, close: 0, wet: 0, unknown: 167 } },
        limits: undefined,
        week: { from: 'a', to: 'b', periodEnd: 'b' },
        timeZone: 'Europe/Berlin',
        unit: 'C',
        showFigures: true,
        chartHeight: 200,
      }),
    );
    expect(html).toContain('No readings this week.');
    expect(html).not.toContain('data-testid="report-zone-figures"');
  });

  it('names the dates each week button goes to and stops at the current week', () => {
    const html = decode(
      renderToStaticMarkup(
        createElement(WeekPicker, {
          start: '2026-03-23',
          latest: true,
          soFar: true,
          onChange() {},
        }),
      ),
    );
    expect(html).toContain('Mon 23 Mar – Sun 29 Mar 2026');
    expect(html).toContain('(so far)');
    expect(html).toContain('← 16–22 Mar');
    expect(html).toContain('30 Mar–5 Apr →');
    expect(html).toMatch(/aria-disabled="true"[^>]*data-testid="report-week-next"/);
  });
});
