// A zone's week figures as the Report screen writes them, for a reader in °F: every temperature
// converted with °F = °C × 9/5 + 32, the dew margin (a difference) × 1.8 with no offset, times on
// the shop's clock, and each number beside its name. Expected strings are worked out by hand in
// the comments; the ISO 9223:1992 Table 1 category is checked against the annualised hours.
// Also the file name a download is saved under, read from Content-Disposition (RFC 6266 with
// RFC 8187's UTF-8 `filename*`), and the level-hours bar writing its numbers, not colour alone.
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';

import { filenameFromDisposition, type ZoneWeekFigures } from '@/components/queries';
import { LevelHoursBar } from '@/components/report/LevelHoursBar';
import { formatAckMinutes, zoneFigureRows } from '@/components/report/reportFigures';
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
  const rows = Object.fromEntries(
    zoneFigureRows(zone, 'F', 'Europe/Berlin').map((row) => [row.key, row]),
  );

  it('converts temperatures as temperatures and the margin as a difference', () => {
    // 10 / 15 / 20 °C → 50.0 / 59.0 / 68.0 °F.
    expect(rows.air).toEqual({
      key: 'air',
      label: 'Air min / mean / max (°F)',
      value: '50.0 °F / 59.0 °F / 68.0 °F',
    });
    // 0.5 K × 1.8 = 0.9 °F, never 0.5 × 1.8 + 32; Tuesday 06:52 Berlin time.
    expect(rows.lowestMargin!.value).toBe('+0.9 °F, Tue 24 Mar 06:52');
    expect(rows.lowestMargin!.label).toContain('°F');
  });

  it('writes RH whole, EMC to a tenth, time of wetness with its ISO 9223 category', () => {
    expect(rows.rh!.value).toBe('60 % / 72 % / 88 %');
    expect(rows.emc!.value).toBe('11.2 % / 12.3 % / 15.1 %');
    expect(rows.timeOfWetness!.value).toBe('31.5 h, τ3');
    expect(rows.coverage!.value).toBe('96 %');
  });

  it('counts alarms by kind, acknowledgement times and silences', () => {
    expect(rows.alarmsOpened!.value).toBe('3: 2 dew risk, 1 wet surface');
    // Median 12 min; longest 150 min = 2.5 h.
    expect(rows.ackTimes!.value).toBe('12 min / 2.5 h');
    expect(rows.unacknowledged!.value).toBe('1');
    // 1.5 h + 1.0 h of silence in two stretches.
    expect(rows.silent!.value).toBe('2, 2.5 h');
  });

  it('shows dashes, not zeros, for what a silent zone never measured', () => {
    const none = { min: null, mean: null, max: null };
    const silent = zoneFigureRows(
      {
        ...zone,
        readings: 0,
        airC: none,
        rhPct: none,
        emcPct: none,
        lowestMargin: null,
        timeOfWetness: { hours: 0, annualHours: null, category: null },
        alarms: { ...zone.alarms, acknowledged: 0, medianAckMinutes: null },
      },
      'C',
      'Europe/Berlin',
    );
    const values = Object.fromEntries(silent.map((row) => [row.key, row.value]));
    expect(values).toMatchObject({ air: '—', rh: '—', emc: '—', lowestMargin: '—', ackTimes: '—' });
    expect(values.timeOfWetness).toBe('0.0 h');
  });

  it('keeps minutes under two hours and hours past them', () => {
    expect(formatAckMinutes(119.4)).toBe('119 min');
    expect(formatAckMinutes(120)).toBe('2.0 h');
    expect(formatAckMinutes(null)).toBe('—');
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
    for (const words of ['Dry 150.0 h', 'Close 9.5 h', 'Wet 0.5 h', 'Unknown 7.0 h'])
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
