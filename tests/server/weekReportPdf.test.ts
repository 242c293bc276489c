// The week report as a PDF through the route, end to end: GET …/reports/week?format=pdf answers
// application/pdf as an attachment, laid out on the shop's paper (US Letter for a Chicago shop
// until the owner picks A4), and its text (read back with pdf-parse) carries every zone with the
// figures the JSON answer has, in the reader's unit, the chart fed from the zone's stored series.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, type TestApp } from '../support/app';
import { binary, parsePdf as pdfText } from '../support/pdf';
import { fahrenheitShopWithSixReadings } from '../support/weekReports';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
});
afterAll(() => t.pool.end());

describe('week report PDF through the route', () => {
  it('answers the shop’s zones on its paper, in °F, as an attachment', async () => {
    // Week of Monday 2026-06-15 in Chicago (CDT, UTC−5 all week: 168 h). Air 10 °C at RH 100 %
    // has its dew point at 10 °C, so a 13 °C surface is 3 K above it: +5.4 °F as a difference.
    // 10 °C = 50.0 °F, 20 °C = 68.0 °F. The first reading, 11:00 UTC, is 06:00 CDT on Tue 16 Jun.
    const o = await fahrenheitShopWithSixReadings(t, {
      name: 'Tamarack Joinery',
      timeZone: 'America/Chicago',
      zones: ['Machine room', 'Finishing room'],
      firstAt: '2026-06-16T11:00:00Z',
    });
    const shopId = o.shopId;

    const path = `/api/v1/shops/${shopId}/reports/week?start=2026-06-15`;
    const json = (await o.agent.get(path).expect(200)).body;
    expect(json.shop.paperSize).toBe('letter');

    const res = await o.agent.get(`${path}&format=pdf`).buffer(true).parse(binary).expect(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toBe(
      'attachment; filename="drybench-week-2026-06-15.pdf"',
    );
    const body = res.body as Buffer;
    expect(body.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const letter = await pdfText(body);
    // ANSI letter: 8.5 × 11 in = 612 × 792 pt.
    for (const page of letter.pages) {
      expect(page.width).toBeCloseTo(612, 1);
      expect(page.height).toBeCloseTo(792, 1);
    }
    const expected = [
      'Week report · Tamarack Joinery',
      'Week of Monday 15 June 2026, America/Chicago time',
      'Machine room',
      // 6 readings, 5 × 10 min + the 15 min cap for the last = 65 min of 168 h: 0.64 % → 1 %.
      'Data coverage 1 % (6 readings)',
      'Lowest dew margin +5.4 °F at Tue 16 Jun 06:00',
      'Finishing room',
      'Data coverage 0 % (0 readings)',
      'page 1 of',
    ];
    for (const text of expected) expect(letter.flat).toContain(text);
    // Air min and max as hand-converted; the mean as the JSON has it, converted the same way.
    expect(letter.flat).toMatch(/Air min \/ mean \/ max 50\.0 °F \/ \d+\.\d °F \/ 68\.0 °F/);
    const meanF = ((json.zones[0].airC.mean as number) * 9) / 5 + 32;
    expect(letter.flat).toContain(`50.0 °F / ${meanF.toFixed(1)} °F / 68.0 °F`);
    // Both verdicts, as the JSON wrote them.
    for (const z of json.zones as { verdict: string }[]) {
      expect(letter.flat).toContain(z.verdict.replace(/\s+/g, ' '));
    }
    // The machine room's chart had its stored series; only the empty zone's says so.
    expect(letter.flat.split('No readings this week').length - 1).toBe(1);

    // The owner picks A4 (ISO 216: 595.28 × 841.89 pt); the next PDF follows.
    await o.agent.patch(`/api/v1/shops/${shopId}`).send({ paperSize: 'a4' }).expect(200);
    const a4 = await pdfText(
      (await o.agent.get(`${path}&format=pdf`).buffer(true).parse(binary).expect(200))
        .body as Buffer,
    );
    for (const page of a4.pages) {
      expect(page.width).toBeCloseTo(595.28, 1);
      expect(page.height).toBeCloseTo(841.89, 1);
    }
    expect(a4.flat).toContain('Lowest dew margin +5.4 °F at Tue 16 Jun 06:00');
  });
});
