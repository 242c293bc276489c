// The trial PDF made from a trial object (no database), read back with pdf-parse: a long trial
// runs over pages with the ranks table's column heads repeated, ties print as shared half ranks,
// the sheet is A4 (ISO 216: 210 × 297 mm = 595.28 × 841.89 pt), and a trial with no ranked test
// says so instead of a Friedman line.
import { describe, expect, it } from 'vitest';

import type { Trial } from '@/ingest/wire/trials';
import { TRIAL_WORDS } from '@/ingest/words/trials';
import type { TrialExport } from '@/server/trials/trialExport';
import { renderTrialPdf } from '@/server/trials/trialPdf';
import { toStandings } from '@/server/wire/trials';

import { parsePdf } from '../support/pdf';

function trialOf(testRanks: number[][], treatments: number): Trial {
  const tr = Array.from({ length: treatments }, (_v, i) => ({
    id: `t${i}`,
    trialId: 'x',
    name: `Treatment ${i + 1}`,
  }));
  const tests = testRanks.map((_r, i) => ({
    id: `s${i}`,
    name: `Test ${i + 1}`,
    kind: 'wear' as const,
    from: new Date(Date.UTC(2026, 0, 5, 8) + i * 86_400_000),
    to: new Date(Date.UTC(2026, 0, 5, 16) + i * 86_400_000),
    zoneId: null,
    sensorId: null,
    notes: null,
  }));
  const ranks = testRanks.flatMap((row, i) =>
    row.map((rank, j) => ({ testId: `s${i}`, treatmentId: `t${j}`, rank })),
  );
  return {
    id: 'x',
    name: 'Long trial',
    createdAt: '2026-01-01T00:00:00.000Z',
    treatments: tr.map((t) => ({ id: t.id, name: t.name })),
    tests: tests.map((t) => ({
      id: t.id,
      name: t.name,
      kind: t.kind,
      from: t.from.toISOString(),
      to: t.to.toISOString(),
      zoneId: null,
      sensorId: null,
      notes: null,
      ranks: ranks
        .filter((r) => r.testId === t.id)
        .map((r) => ({ treatmentId: r.treatmentId, rank: r.rank })),
      conditions: null,
      photos: [],
    })),
    standings: toStandings(tr, tests, ranks),
  };
}

const exportOf = (trial: Trial): TrialExport => ({
  trial,
  shop: { name: 'Tamarack', timeZone: 'Europe/Berlin', paperSize: 'a4' },
  unit: 'C',
  zoneNames: new Map(),
  generatedAt: '2026-03-09T06:00:00.000Z',
});

describe('trial PDF', () => {
  it('repeats the ranks table’s heads on every page of a long trial and prints ties', async () => {
    // 60 tests × 12 treatments; the first test ties the first two for best (1.5 each).
    const rows = Array.from({ length: 60 }, (_v, i) =>
      Array.from({ length: 12 }, (_w, j) => (i === 0 && j < 2 ? 1.5 : ((i + j) % 12) + 1)),
    );
    const pdf = await parsePdf(await renderTrialPdf(exportOf(trialOf(rows, 12))));
    expect(pdf.pages[0]).toEqual({ width: 595.28, height: 841.89 });
    expect(pdf.total).toBeGreaterThan(1);
    expect(pdf.flat).toContain(`page ${pdf.total} of ${pdf.total}`);
    const heads = pdf.flat.split('Test T1 T2 T3 T4 T5 T6 T7 T8 T9 T10 T11 T12').length - 1;
    // 60 rows of 14 pt need more than one page: the heads at least twice.
    expect(heads).toBeGreaterThanOrEqual(2);
    expect(pdf.flat).toContain('Test 1 1.5 1.5 3 4 5 6 7 8 9 10 11 12');
    expect(pdf.flat).toContain('Test 60');
    // Berlin is UTC+1 in March: made 07:00 local.
    expect(pdf.flat).toContain('made 2026-03-09 07:00 +01:00 (Europe/Berlin)');
  });

  it('says no test is ranked yet instead of a Friedman line', async () => {
    const pdf = await parsePdf(await renderTrialPdf(exportOf(trialOf([], 3))));
    // Said once, under the standings.
    expect(pdf.flat.split(TRIAL_WORDS.noTests)).toHaveLength(2);
    expect(pdf.flat).not.toContain('Friedman chi-square =');
  });
});
