// A trial exported as CSV and PDF, read back (papaparse; pdf-parse, which wraps Mozilla's pdf.js)
// and held to the figures worked by hand in tests/support/trialExample.ts (4 treatments × 5
// tests without ties: rank totals 6, 10, 15, 19; Friedman χ² = 11.64, df = 3, p = 0.008724 after
// Conover, Practical Nonparametric Statistics, 3rd ed., §5.8; Kendall's W = 0.776). The conditions of the first test are tests/server/trials.test.ts'
// hand-worked hour (lowest margin 1 K, RH 100 %, 0.5 h wet, 1 h of ISO 9223 wetness); in °F the
// margin is a difference, 1 K × 1.8 = 1.8 °F.
import Papa from 'papaparse';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { errorShape } from '../support/errorShape';
import { postIngest } from '../support/ingest';
import { binary, parsePdf } from '../support/pdf';
import { WORKED, WORKED_RANKS } from '../support/trialExample';

let t: TestApp;
let o: Awaited<ReturnType<typeof ownerWithSensor>>;
let trialPath: string;

const MIN_MS = 60_000;
const TREATMENTS = ['Paste wax', 'Camellia oil', 'Dry lubricant', '=Bare iron'];
const RANKS = WORKED_RANKS;

const every10 = (startIso: string, n: number, surface: number) =>
  Array.from({ length: n }, (_, i) => ({
    at: new Date(Date.parse(startIso) + i * 10 * MIN_MS).toISOString(),
    air: 10,
    rh: 100,
    surface,
  }));

beforeAll(async () => {
  t = makeTestApp();
  o = await ownerWithSensor(t); // Europe/Oslo: CET, UTC+1, until 29 March 2026
  await o.agent.patch('/api/v1/me').send({ unitPref: 'F' }).expect(200);
  // At 100 % RH the dew point is the air temperature: a 12 °C surface over 10 °C air is a 2 K
  // margin (close), 11 °C a 1 K margin (wet).
  await postIngest(t.app, o.token, {
    readings: [
      ...every10('2026-03-23T00:00:00Z', 3, 12),
      ...every10('2026-03-23T00:30:00Z', 3, 11),
    ],
  }).expect(202);
  const base = `/api/v1/shops/${o.shopId}/trials`;
  const trial = (
    await o.agent
      .post(base)
      .send({ name: 'Saw table protection, spring', treatments: TREATMENTS })
      .expect(201)
  ).body as { id: string; treatments: { id: string }[] };
  trialPath = `${base}/${trial.id}`;
  for (const [i, ranks] of RANKS.entries()) {
    const day = `2026-03-2${3 + i}`;
    const test = (
      await o.agent
        .post(`${trialPath}/tests`)
        .send({
          name: `Wet rag night ${i + 1}`,
          kind: 'condensation',
          from: `${day}T00:00:00Z`,
          to: `${day}T01:00:00Z`,
          ...(i === 0 ? { zoneId: o.zoneId, notes: '+door left open' } : {}),
        })
        .expect(201)
    ).body as { id: string };
    await o.agent
      .put(`${trialPath}/tests/${test.id}/ranks`)
      .send({ ranks: trial.treatments.map((x, j) => ({ treatmentId: x.id, rank: ranks[j] })) })
      .expect(200);
  }
});
afterAll(() => t.pool.end());

type Row = Record<string, string>;

describe('trial export', () => {
  it('answers a CSV that parses back to the standings and the worked Friedman figures', async () => {
    const res = await o.agent.get(`${trialPath}?format=csv`).expect(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    // Made "now" on the shop's calendar; the slug keeps letters and digits of the name.
    expect(res.headers['content-disposition']).toMatch(
      /^attachment; filename="trial-saw-table-protection-spring-\d{4}-\d{2}-\d{2}\.csv"$/,
    );
    // RFC 4180 line ends.
    expect(res.text.endsWith('\r\n')).toBe(true);
    expect(res.text.replace(/\r\n/g, '')).not.toContain('\n');

    const rows = Papa.parse<Row>(res.text, { header: true, skipEmptyLines: true }).data;
    const of = (section: string) => rows.filter((r) => r.Section === section);
    expect(of('trial').map((r) => r.Words)).toEqual(['Saw table protection, spring']);

    // One line per test × treatment, the ranks as entered.
    const ranks = of('rank');
    expect(ranks).toHaveLength(5 * 4);
    for (const [i, testRanks] of RANKS.entries()) {
      const lines = ranks.filter((r) => r.Test === `Wet rag night ${i + 1}`);
      expect(lines.map((r) => Number(r['Rank (1 = best)']))).toEqual(testRanks);
    }
    // A treatment named like a formula stays text (OWASP CSV injection: a leading quote).
    expect(ranks[3]!.Treatment).toBe("'=Bare iron");
    const first = ranks[0]!;
    expect(first).toMatchObject({
      Kind: 'Condensation',
      // 00:00Z is 01:00 in Oslo in March (CET, UTC+1).
      'From (shop time)': '2026-03-23T01:00+01:00',
      'To (shop time)': '2026-03-23T02:00+01:00',
      Zone: 'Machine room',
      'Lowest dew margin (°F difference)': '1.8',
      'Highest RH (%)': '100',
      'Hours wet (h)': '0.5',
      'Time of wetness (h)': '1',
      Note: "'+door left open",
    });
    // A test without a zone has no conditions.
    expect(ranks[4]!.Zone).toBe('');
    expect(ranks[4]!['Hours wet (h)']).toBe('');

    // Standings best first, with the hand-summed rank totals.
    expect(of('standing').map((r) => [r.Treatment, r['Rank total'], r['Mean rank']])).toEqual([
      ['Paste wax', '6', '1.2'],
      ['Camellia oil', '10', '2'],
      ['Dry lubricant', '15', '3'],
      ["'=Bare iron", '19', '3.8'],
    ]);
    const [friedman] = of('friedman');
    expect(Number(friedman!['Friedman chi-square'])).toBeCloseTo(WORKED.statistic, 9);
    expect(friedman!['Degrees of freedom']).toBe('3');
    expect(Number(friedman!.p)).toBeCloseTo(WORKED.p, 6);
    expect(Number(friedman!["Kendall's W"])).toBeCloseTo(WORKED.kendallW, 9);
    expect(friedman!.Words).toContain('Paste wax ranked best');
    expect(friedman!.Words).toContain('rough guide'); // 5 tests: the few-tests caution
    // p < 0.05: the pairs, with their method named.
    const pairs = of('pair');
    expect(pairs).toHaveLength(6); // 4 treatments: C(4, 2)
    // Paste wax (mean 1.2) against the last (3.8): z = 2.6 / sqrt(4·5/(6·5)) = 3.184 (Demšar
    // 2006, §3.2.2), the smallest p of the six, so Holm multiplies it by 6.
    expect(pairs[0]).toMatchObject({ Treatment: 'Paste wax', 'Compared with': "'=Bare iron" });
    expect(Number(pairs[0]!.z)).toBeCloseTo(2.6 / Math.sqrt(20 / 30), 4);
    expect(Number(pairs[0]!['Holm-adjusted p'])).toBeCloseTo(6 * Number(pairs[0]!.p), 5);
    expect(of('method').map((r) => r.Words)).toEqual([
      expect.stringContaining('Conover'),
      expect.stringContaining('Holm'),
    ]);
  });

  it('answers a PDF on the shop’s paper with the ranks, conditions and Friedman result', async () => {
    const owner = o;
    await owner.agent
      .patch(`/api/v1/shops/${owner.shopId}`)
      .send({ paperSize: 'letter' })
      .expect(200);
    const res = await owner.agent
      .get(`${trialPath}?format=pdf`)
      .buffer(true)
      .parse(binary)
      .expect(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toMatch(
      /^attachment; filename="trial-saw-table-protection-spring-\d{4}-\d{2}-\d{2}\.pdf"$/,
    );
    const pdf = await parsePdf(res.body as Buffer);
    // ANSI letter: 8.5 × 11 in = 612 × 792 pt.
    expect(pdf.pages[0]).toEqual({ width: 612, height: 792 });
    expect(pdf.flat).toContain('Trial · Saw table protection, spring');
    expect(pdf.flat).toContain(`page 1 of ${pdf.total}`);
    expect(pdf.flat).toContain('Friedman chi-square = 11.64, df = 3, p = 0.0087');
    expect(pdf.flat).toContain("Kendall's W = 0.78");
    // Rank totals and mean ranks as in the table.
    expect(pdf.flat).toMatch(/Rank total 6 10 15 19/);
    expect(pdf.flat).toMatch(/Mean rank 1\.20 2\.00 3\.00 3\.80/);
    // The first test's conditions in °F (a difference), on the shop's clock.
    expect(pdf.flat).toContain('Mon 23 Mar 01:00 – Mon 23 Mar 02:00 · Machine room');
    expect(pdf.flat).toContain('Lowest dew margin +1.8 °F · Highest RH 100 % · Hours wet 0.5 h');
    expect(pdf.flat).toContain('Time of wetness (ISO 9223) 1 h');
    expect(pdf.flat).toContain('No zone: conditions not recorded.');
    // The few-tests caution, and the pairs with their method and source.
    expect(pdf.flat).toContain('With 5 tests this is a rough guide');
    expect(pdf.flat).toContain('Paste wax over =Bare iron: p = ');
    expect(pdf.flat).toContain('Demšar');
  });

  it('keeps the files to the shop: another shop’s owner 404, no session 401', async () => {
    const stranger = await ownerWithSensor(t);
    for (const format of ['csv', 'pdf']) {
      const foreign = await stranger.agent.get(`${trialPath}?format=${format}`);
      expect(foreign.status).toBe(404);
      expect(foreign.body).toMatchObject(errorShape);
      expect(foreign.text).not.toContain('Saw table');
      const anonymous = await request(t.app).get(`${trialPath}?format=${format}`);
      expect(anonymous.status).toBe(401);
    }
  });

  it.each([
    ['format xls', 'format=xls', 'format'],
    ['format given twice', 'format=csv&format=pdf', 'format'],
    ['format as an array (an unknown key to the parser)', 'format[]=csv', ''],
    ['an unknown key', 'format=csv&download=1', ''],
  ])('refuses %s with a 400 in the shared shape', async (_name, query, detailPath) => {
    const res = await o.agent.get(`${trialPath}?${query}`);
    expect(res.status, res.text).toBe(400);
    expect(res.body).toMatchObject(errorShape);
    expect(res.body.error.code).toBe('invalid_input');
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(detailPath);
  });
});
