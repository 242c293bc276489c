/**
 * The week report's PDF, read back with a PDF parser (pdf-parse, which wraps Mozilla's pdf.js):
 * every zone's name and figures as the page prints them, the sheet size against ISO 216 (A4,
 * 210 × 297 mm) and ANSI (letter, 8.5 × 11 in), page numbers, the embedded JetBrains Mono, the
 * making time in the shop's zone, and the chart's geometry on the shop's calendar days.
 * Expected texts are worked out by hand beside each check (°F = °C × 1.8 + 32; a margin is a
 * difference, so only × 1.8).
 */
import { describe, expect, it } from 'vitest';

import type { UnitPref } from '@/ingest/wire/people';
import type { ReadingPoint } from '@/ingest/wire/readings';
import type { WeekReport } from '@/ingest/wire/reports';
import { renderWeekReportPdf } from '@/server/reports/pdf';
import { marginChartGeometry } from '@/server/reports/pdfChart';
import { parsePdf } from '@/tests/support/pdf';
import {
  BERLIN_WEEK,
  CHICAGO_WEEK,
  LONG_ZONE_NAME,
  lumberRack,
  machineRoom,
  marginSeries,
  tamarackReport,
  type ShopWeek,
} from '@/tests/support/weekReports';

function seriesFor(week: ShopWeek): Map<string, ReadingPoint[]> {
  return new Map([
    ['zone-machine-room', marginSeries(week, 3.5)],
    [
      'zone-lumber',
      marginSeries(week, 1.5, 20, {
        from: '2026-03-05T01:00:00.000Z',
        to: '2026-03-05T03:30:00.000Z',
      }),
    ],
    // zone-finishing sent nothing: no series at all.
  ]);
}

async function render(week: ShopWeek, unit: UnitPref, report?: WeekReport) {
  const pdf = await renderWeekReportPdf({
    report: report ?? tamarackReport(week, unit),
    series: seriesFor(week),
  });
  return { pdf, parsed: await parsePdf(pdf) };
}

describe('week report PDF, Berlin shop on A4 in °C', () => {
  it('prints every zone with its figures as worked out by hand', async () => {
    const { parsed } = await render(BERLIN_WEEK, 'C');
    const expected = [
      'Week report · Tamarack Joinery',
      'Week of Monday 2 March 2026, Europe/Berlin time',
      // Whole shop: lowest −0.4 K at 07:40 UTC = 08:40 CET (UTC+1) on Thu 5 Mar.
      'Zones / data coverage 3 / 66 %',
      'Lowest dew margin -0.4 °C in Lumber rack at Thu 5 Mar 08:40',
      'Hours wet / close, all zones 7.5 h / 42.5 h; 2 zones wet',
      // Median 9.5 min rounds to 10 min.
      'Alarms opened 4; median to acknowledge 10 min; 1 not acknowledged',
      'Two zones were wet this week; one alarm is still waiting for an answer.',
      // Machine room.
      'Machine room',
      'Data coverage 100 % (2004 readings)',
      'Air min / mean / max 8.1 °C / 12.3 °C / 17.0 °C',
      // RH 88.6 % rounds to 89 %.
      'RH min / mean / max 55 % / 70 % / 89 %',
      // 12:10 UTC = 13:10 CET.
      'Lowest dew margin +0.8 °C at Tue 3 Mar 13:10',
      'Hours dry / close / wet / unknown 150 h / 12.5 h / 1.5 h / 4 h',
      // 12.5 h of 168 h over a year: 12.5 / 168 × 8760 = 651.8 h, ISO 9223:1992 τ3 (250–2500 h).
      'Time of wetness, ISO 9223: RH > 80 % and air > 0 °C 12.5 h; 652 h a year at this rate, category T3',
      'Wood EMC min / mean / max 10.2 % / 13.1 % / 17.9 %',
      'Alarms 3 opened (Dew risk 2, Wet surface 1), 2 acknowledged',
      // 95 min = 1.58 h, shown to a tenth from 90 min on.
      'To acknowledge median / longest 12 min / 1.6 h; 1 not acknowledged',
      'The tops came within 0.8 K of the dew point on Tuesday and were wet for 1.5 h.',
      // Lumber rack, a name too long for one line.
      LONG_ZONE_NAME,
      'Air min / mean / max -2.5 °C / 4.0 °C / 10.0 °C',
      'Lowest dew margin -0.4 °C at Thu 5 Mar 08:40',
      // 40 h of 163.3 covered h: 40 / 163.3 × 8760 = 2145.7 h → τ3.
      '°C 40 h; 2146 h a year at this rate, category T3',
      'Alarms 1 opened (Sensor silent 1), 1 acknowledged',
      // 01:00–03:30 UTC = 02:00–04:30 CET.
      'Silent periods 1 (2.5 h): Thu 5 Mar 02:00 – Thu 5 Mar 04:30',
      'Stock stayed damp: wood EMC reached 20.3 % on Thursday.',
      // Finishing room: no readings at all.
      'Finishing room',
      'Data coverage 0 % (0 readings)',
      'Air min / mean / max — / — / —',
      'Lowest dew margin no surface data',
      'Hours dry / close / wet / unknown 0 h / 0 h / 0 h / 168 h',
      'No readings this week',
      'No readings this week: is its sensor placed and powered?',
      // Made 06:30 UTC = 07:30 CET.
      'made 2026-03-09 07:30 +01:00 (Europe/Berlin)',
    ];
    for (const text of expected) expect(parsed.flat).toContain(text);
    // The level of each zone in words, not only in colour.
    expect(parsed.flat).toContain('Worst: Wet');
    expect(parsed.flat).toContain('Worst: Unknown');
    expect(parsed.flat).not.toContain('°F');
  });

  it('lays out on ISO 216 A4 (210 × 297 mm = 595.28 × 841.89 pt), numbered "page i of n"', async () => {
    const { parsed } = await render(BERLIN_WEEK, 'C');
    expect(parsed.total).toBeGreaterThanOrEqual(2);
    expect(parsed.pages).toHaveLength(parsed.total);
    for (const page of parsed.pages) {
      expect(page.width).toBeCloseTo((210 / 25.4) * 72, 1);
      expect(page.height).toBeCloseTo((297 / 25.4) * 72, 1);
    }
    for (let i = 1; i <= parsed.total; i += 1) {
      expect(parsed.flat).toContain(`page ${i} of ${parsed.total}`);
    }
    expect(parsed.flat).not.toContain(`page ${parsed.total + 1} of`);
  });

  it('embeds JetBrains Mono (regular and bold) and names Drybench in the metadata', async () => {
    const { pdf, parsed } = await render(BERLIN_WEEK, 'C');
    // Font dictionaries are not compressed: a subset font is named "ABCDEF+<PostScript name>"
    // (ISO 32000-1 §9.6.4) and carries its glyphs as a FontFile2 (TrueType) stream.
    const raw = pdf.toString('latin1');
    expect(raw).toMatch(/\/BaseFont \/[A-Z]{6}\+JetBrainsMono-Regular/);
    expect(raw).toMatch(/\/BaseFont \/[A-Z]{6}\+JetBrainsMono-Bold/);
    expect(raw).toContain('/FontFile2');
    // No fallback to a standard font anywhere in the document.
    expect(raw).not.toMatch(/Helvetica|Courier|Times-Roman/);
    expect(parsed.info.Title).toBe('Week report Tamarack Joinery 2026-03-02');
    expect(parsed.info.Author).toBe('Drybench');
  });
});

describe('week report PDF, Chicago shop on US Letter in °F across the spring clock change', () => {
  it('prints the figures in °F, margins as differences, and the 167-hour note', async () => {
    const { parsed } = await render(CHICAGO_WEEK, 'F');
    const expected = [
      'Week of Monday 2 March 2026, America/Chicago time',
      'This week had 167 hours: clocks went forward on Sunday 8 March.',
      // −0.4 K × 1.8 = −0.72 °F; 07:40 UTC = 01:40 CST (UTC−6).
      'Lowest dew margin -0.7 °F in Lumber rack at Thu 5 Mar 01:40',
      // 8.1 °C = 46.58 °F, 12.34 °C = 54.21 °F, 17 °C = 62.6 °F.
      'Air min / mean / max 46.6 °F / 54.2 °F / 62.6 °F',
      // 0.8 K × 1.8 = 1.44 °F, not 33.4 °F; 12:10 UTC = 06:10 CST.
      'Lowest dew margin +1.4 °F at Tue 3 Mar 06:10',
      // −2.5 °C = 27.5 °F, 4.05 °C = 39.29 °F, 9.96 °C = 49.93 °F.
      'Air min / mean / max 27.5 °F / 39.3 °F / 49.9 °F',
      // 01:00–03:30 UTC = 19:00–21:30 CST the evening before.
      'Silent periods 1 (2.5 h): Wed 4 Mar 19:00 – Wed 4 Mar 21:30',
      'Hours dry / close / wet / unknown 0 h / 0 h / 0 h / 167 h',
      // Made 06:30 UTC on Mon 9 Mar = 01:30 CDT (UTC−5, after the change).
      'made 2026-03-09 01:30 -05:00 (America/Chicago)',
    ];
    for (const text of expected) expect(parsed.flat).toContain(text);
    // No figure in °C; the only °C is ISO 9223's definition in the time-of-wetness label.
    expect(parsed.flat.replaceAll('air > 0 °C', '')).not.toMatch(/°C/);
  });

  it('lays out on ANSI letter (8.5 × 11 in = 612 × 792 pt)', async () => {
    const { parsed } = await render(CHICAGO_WEEK, 'F');
    for (const page of parsed.pages) {
      expect(page.width).toBeCloseTo(8.5 * 72, 1);
      expect(page.height).toBeCloseTo(11 * 72, 1);
    }
    expect(parsed.flat).toContain(`page ${parsed.total} of ${parsed.total}`);
  });

  it('says when the figures stop short of the week (the current week)', async () => {
    const report = tamarackReport(CHICAGO_WEEK, 'F');
    // Wed 4 Mar 2026 20:15 UTC = 14:15 CST.
    report.week.periodEnd = '2026-03-04T20:15:00.000Z';
    const { parsed } = await render(CHICAGO_WEEK, 'F', report);
    expect(parsed.flat).toContain('Figures up to Wed 4 Mar 14:15: the week is not over.');
  });
});

describe('the margin chart', () => {
  const box = { x: 0, y: 0, width: 700, height: 100 };

  it('draws the day lines on the shop’s midnights, across a 167-hour week', () => {
    const geometry = marginChartGeometry(
      {
        points: [],
        fromMs: Date.parse(CHICAGO_WEEK.from),
        toMs: Date.parse(CHICAGO_WEEK.to),
        weekStart: CHICAGO_WEEK.start,
        timeZone: CHICAGO_WEEK.timeZone,
        lowestMarginK: null,
      },
      box,
    );
    // Chicago midnights are 24 h apart until Sun 8 Mar 00:00 CST (144 h after the start); the
    // week then ends 23 h later at Mon 9 Mar 00:00 CDT: 167 h in all.
    expect(geometry.days.map((d) => d.label)).toEqual([
      'Mon 2',
      'Tue 3',
      'Wed 4',
      'Thu 5',
      'Fri 6',
      'Sat 7',
      'Sun 8',
    ]);
    geometry.days.forEach((day, i) => expect(day.x).toBeCloseTo(((24 * i) / 167) * 700, 6));
  });

  it('keeps zero on the scale, breaks the line at a hole and keeps the lowest of dense data', () => {
    const fromMs = Date.parse(BERLIN_WEEK.from);
    const minute = 60_000;
    // One reading a minute for a day: +3 K except one minute at −1 K, then a 3 h hole, then
    // a day more at +1 K. 1440 readings a day is more than the 1400 half-points across.
    const points: ReadingPoint[] = [];
    const push = (atMs: number, marginK: number) =>
      points.push({
        at: new Date(atMs).toISOString(),
        air: 12,
        rh: 70,
        surface: 10,
        dewPoint: 10 - marginK,
        margin: marginK,
        marginMin: marginK,
        marginMax: marginK,
        emc: 13,
        level: 'dry',
        count: 1,
      });
    for (let m = 0; m < 1440; m += 1) push(fromMs + m * minute, m === 600 ? -1 : 3);
    for (let m = 1440 + 180; m < 2 * 1440 + 180; m += 1) push(fromMs + m * minute, 1);
    const geometry = marginChartGeometry(
      {
        points,
        fromMs,
        toMs: Date.parse(BERLIN_WEEK.to),
        weekStart: BERLIN_WEEK.start,
        timeZone: BERLIN_WEEK.timeZone,
        lowestMarginK: -1,
      },
      box,
    );
    // Values −1 … 3 K, padded by 8 % of the 4 K span each way: −1.32 … 3.32 K.
    expect(geometry.loK).toBeCloseTo(-1.32, 9);
    expect(geometry.hiK).toBeCloseTo(3.32, 9);
    // Zero at (3.32 − 0) / 4.64 of the height; −1 K at (3.32 + 1) / 4.64.
    expect(geometry.zeroY).toBeCloseTo((3.32 / 4.64) * 100, 6);
    expect(geometry.lowestY).toBeCloseTo((4.32 / 4.64) * 100, 6);
    // The 3 h hole is longer than the 15 min gap cap: two lines.
    expect(geometry.lines).toHaveLength(2);
    // Thinned to at most one point per half-point column, and the one-minute dip survives.
    expect(geometry.lines[0]!.length).toBeLessThan(1440);
    expect(Math.max(...geometry.lines[0]!.map(([, y]) => y))).toBeCloseTo((4.32 / 4.64) * 100, 6);
  });
});

describe('render time', () => {
  it('renders a 10-zone shop (measured and printed, not asserted)', async () => {
    const week = BERLIN_WEEK;
    const zones = Array.from({ length: 10 }, (_, i) => ({
      ...(i % 2 === 0 ? machineRoom(week.hours) : lumberRack(week.hours)),
      zoneId: `zone-${i}`,
      name: `Zone ${i + 1}`,
    }));
    const report = tamarackReport(week, 'C', zones);
    // 500 points a zone: the history API's most for a week.
    const series = new Map(zones.map((z) => [z.zoneId, marginSeries(week, 2, 20.2)]));
    await renderWeekReportPdf({ report, series }); // warm: font files, fontkit, date-fns-tz
    const timesMs: number[] = [];
    // The machine is shared: the fastest run says what rendering costs, the median what load adds.
    for (let i = 0; i < 7; i += 1) {
      const t0 = performance.now();
      const pdf = await renderWeekReportPdf({ report, series });
      timesMs.push(performance.now() - t0);
      expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    }
    timesMs.sort((a, b) => a - b);
    console.log(
      `week report PDF, 10 zones × ${series.get('zone-0')!.length} points: fastest ${timesMs[0]!.toFixed(0)} ms, median ${timesMs[3]!.toFixed(0)} ms, slowest ${timesMs[6]!.toFixed(0)} ms`,
    );
    const { parsed } = await render(week, 'C', report);
    for (const zone of zones) expect(parsed.flat).toContain(zone.name);
  });
});
