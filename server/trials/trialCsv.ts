/**
 * A trial as one CSV table (a spreadsheet opens one table per file): every line starts with a
 * `Section` cell saying what it holds, and each section fills only its own columns.
 *
 * - `trial`: the trial's name (Words) — one line.
 * - `rank`: one line per test × treatment: the test, its kind, its window on the shop's clock
 *   with the offset, its zone and the conditions recorded there (in the reader's unit), the
 *   treatment and its rank (empty until the test is ranked), the test's note.
 * - `standing`: one line per treatment, best first: rank total and mean rank.
 * - `friedman`: one line: statistic, df, p, Kendall's W and the verdict in words (empty numbers
 *   until two tests are ranked).
 * - `pair`: one line per compared pair (only when the Friedman p is below 0.05): the better
 *   treatment, the one compared with, z, p and the Holm-adjusted p, and whether they differ.
 * - `method`: the methods and their sources, in words.
 *
 * UTF-8 with CRLF line ends; text cells that a spreadsheet would run as a formula are quoted
 * (reports/csv.ts neutraliseCell).
 */
import Papa from 'papaparse';

import { kToFDelta } from '@/ingest/units';
import {
  TRIAL_FRIEDMAN_METHOD,
  TRIAL_KIND_WORDS,
  TRIAL_PAIRS_METHOD,
  trialCsvHeader,
  trialPairText,
  type TrialCsvColumn,
} from '@/ingest/words/trials';

import { neutraliseCell } from '../reports/csv';

import { shopTimeWithOffset, type TrialExport } from './trialExport';

type Line = Partial<Record<TrialCsvColumn, string | number | null>>;

/** Hours and temperatures to 3 decimals, as the week report's CSV gives them. */
const measured = (value: number | null) => (value === null ? null : Number(value.toFixed(3)));
/** Statistics to 6 significant figures: a p of 0.0087 must not round to 0.009. */
const statistic = (value: number | null) => (value === null ? null : Number(value.toPrecision(6)));

function cell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return String(value);
  return neutraliseCell(value);
}

export function trialCsv(e: TrialExport): string {
  const { trial, unit } = e;
  const tz = e.shop.timeZone;
  const nameOf = (id: string) => trial.treatments.find((t) => t.id === id)?.name ?? '';
  const lines: Line[] = [{ section: 'trial', words: trial.name }];

  for (const test of trial.tests) {
    const c = test.conditions ?? null;
    const margin = c?.lowestMarginK ?? null;
    const shared: Line = {
      test: test.name,
      kind: TRIAL_KIND_WORDS[test.kind],
      from: shopTimeWithOffset(test.from, tz),
      to: shopTimeWithOffset(test.to, tz),
      zone: test.zoneId ? (e.zoneNames.get(test.zoneId) ?? '') : null,
      lowestMargin: measured(margin === null ? null : unit === 'F' ? kToFDelta(margin) : margin),
      highestRh: measured(c?.highestRhPct ?? null),
      hoursWet: c ? measured(c.hoursWet) : null,
      timeOfWetness: c ? measured(c.timeOfWetnessHours) : null,
      note: test.notes,
    };
    for (const treatment of trial.treatments) {
      const rank = test.ranks.find((r) => r.treatmentId === treatment.id)?.rank ?? null;
      lines.push({ section: 'rank', ...shared, treatment: treatment.name, rank });
    }
  }

  const { standings } = trial;
  const best = [...standings.rankTotals].sort((a, b) => a.meanRank - b.meanRank);
  for (const r of best) {
    lines.push({
      section: 'standing',
      treatment: nameOf(r.treatmentId),
      rankTotal: r.total,
      meanRank: statistic(r.meanRank),
    });
  }
  const f = standings.friedman;
  lines.push({
    section: 'friedman',
    statistic: statistic(f?.statistic ?? null),
    df: f?.df ?? null,
    p: statistic(f?.p ?? null),
    kendallW: statistic(standings.kendallW),
    words: standings.verdict,
  });
  for (const pair of standings.pairs) {
    const better = nameOf(pair.better);
    const worse = nameOf(pair.worse);
    lines.push({
      section: 'pair',
      treatment: better,
      comparedWith: worse,
      z: statistic(pair.z),
      p: statistic(pair.p),
      adjustedP: statistic(pair.adjustedP),
      words: trialPairText(better, worse, pair),
    });
  }
  lines.push({ section: 'method', words: TRIAL_FRIEDMAN_METHOD });
  if (standings.pairs.length > 0) lines.push({ section: 'method', words: TRIAL_PAIRS_METHOD });

  const header = trialCsvHeader(unit);
  const rows = lines.map((line) => header.map((column) => cell(line[column.key])));
  return `${Papa.unparse([header.map((c) => c.label), ...rows], { newline: '\r\n' })}\r\n`;
}
