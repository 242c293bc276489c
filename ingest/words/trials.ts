/**
 * The words of a protection trial's standings: who ranked best, whether the differences are
 * more than chance, and the caution when there are too few tests to tell.
 */
import { MIN_TESTS_FOR_CONFIDENCE, SIGNIFICANCE_P, type Standings } from '../trials/standings';
import type { TemperatureUnit } from '../units';
import type { TrialTestConditions, TrialTestKind } from '../wire/trials';
import { formatMargin, formatPercent } from './format';
import { formatHours } from './report';

/** p as people read it: two significant figures, "p < 0.001" below that. */
export function formatP(p: number): string {
  if (p < 0.001) return 'p < 0.001';
  return `p = ${Number(p.toPrecision(2))}`;
}

export const TRIAL_WORDS = {
  noTests: 'No tests ranked yet: rank the treatments after each test.',
  allTied: 'Every test so far ranks the treatments alike: no treatment stands out.',
} as const;

function rankMore(count: number): string {
  return `rank at least ${count} more ${count === 1 ? 'test' : 'tests'}`;
}

/**
 * One or two sentences for the standings, with the treatments' names in input order. Ties for
 * best are named together.
 */
export function trialVerdict(standings: Standings, names: readonly string[]): string {
  const { tests, friedman, rankTotals } = standings;
  if (tests === 0) return TRIAL_WORDS.noTests;
  if (tests < 2) return `Too few tests to tell: ${rankMore(2 - tests)}.`;
  if (!friedman) return TRIAL_WORDS.allTied;
  const best = Math.min(...rankTotals.map((r) => r.meanRank));
  const leaders = rankTotals
    .filter((r) => Math.abs(r.meanRank - best) < 1e-9)
    .map((r) => names[r.treatment] ?? `Treatment ${r.treatment + 1}`);
  const lead =
    leaders.length === 1
      ? `${leaders[0]} ranked best`
      : `${leaders.join(' and ')} ranked best together`;
  const chance =
    friedman.p < SIGNIFICANCE_P
      ? `the differences are more than chance (${formatP(friedman.p)})`
      : `the differences could be chance (${formatP(friedman.p)})`;
  const caution =
    tests < MIN_TESTS_FOR_CONFIDENCE
      ? ` With ${tests} tests this is a rough guide: ${rankMore(MIN_TESTS_FOR_CONFIDENCE - tests)} to be surer.`
      : '';
  return `${lead}; ${chance}.${caution}`;
}

/** The kinds of test as the screens and files name them. */
export const TRIAL_KIND_WORDS: Record<TrialTestKind, string> = {
  condensation: 'Condensation',
  standing_liquid: 'Standing liquid',
  wear: 'Wear',
  humid_storage: 'Humid storage',
  other: 'Other',
};

/**
 * The pairwise method as the screen, the CSV and the PDF name it, with its source
 * (ingest/trials/standings.ts): shown only under a Friedman p below 0.05.
 */
export const TRIAL_PAIRS_METHOD =
  "Pairs compared by Demšar's z on mean ranks with Holm's adjustment (J. Demšar, JMLR 7, 2006, section 3.2.2), only because the Friedman p is below 0.05.";

/** The Friedman test as the CSV and PDF name it, with the book the statistic follows. */
export const TRIAL_FRIEDMAN_METHOD =
  "Friedman test with the tie correction (W. J. Conover, Practical Nonparametric Statistics, 3rd ed., 1999, section 5.8); p from the chi-square distribution; Kendall's W from the same statistic.";

/** One compared pair: "Paste wax over Bare iron: p = 0.012 — differs". */
export function trialPairText(
  better: string,
  worse: string,
  pair: { adjustedP: number; differs: boolean },
): string {
  return `${better} over ${worse}: ${formatP(pair.adjustedP)} — ${pair.differs ? 'differs' : 'could be chance'}`;
}

/**
 * The conditions of a test as label and text, for the screen and the PDF. A dew margin is a
 * difference, so formatMargin scales it to °F without an offset.
 */
export function trialConditionLines(
  c: TrialTestConditions,
  unit: TemperatureUnit,
): [string, string][] {
  return [
    ['Lowest dew margin', formatMargin(c.lowestMarginK, unit)],
    ['Highest RH', formatPercent(c.highestRhPct)],
    ['Hours wet', formatHours(c.hoursWet)],
    ['Time of wetness (ISO 9223)', formatHours(c.timeOfWetnessHours)],
  ];
}

export const TRIAL_CONDITION_WORDS = {
  noZone: 'No zone: conditions not recorded.',
  noReadings: 'No readings from the zone during this test yet.',
} as const;

/**
 * The export's file name: `trial-<slug>-<date>.csv`. The slug keeps ASCII letters and digits of
 * the trial's name (accents dropped), so the name is safe in a Content-Disposition header and on
 * every file system; `date` is YYYY-MM-DD on the shop's calendar.
 */
export function trialFileName(trialName: string, date: string, format: 'csv' | 'pdf'): string {
  const slug = trialName
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 40)
    .replace(/-+$/, '');
  return `trial-${slug ? `${slug}-` : ''}${date}.${format}`;
}

/** The trial CSV's columns in order (server/trials/trialCsv.ts says which section fills which). */
export const TRIAL_CSV_COLUMNS = [
  'section',
  'test',
  'kind',
  'from',
  'to',
  'zone',
  'lowestMargin',
  'highestRh',
  'hoursWet',
  'timeOfWetness',
  'treatment',
  'rank',
  'note',
  'rankTotal',
  'meanRank',
  'statistic',
  'df',
  'p',
  'kendallW',
  'comparedWith',
  'z',
  'adjustedP',
  'words',
] as const;
export type TrialCsvColumn = (typeof TRIAL_CSV_COLUMNS)[number];

/**
 * The header, with units in the reader's scale. A dew margin is a difference, labelled as one
 * so it never reads like an air temperature.
 */
export function trialCsvHeader(unit: TemperatureUnit): { key: TrialCsvColumn; label: string }[] {
  const labels: Record<TrialCsvColumn, string> = {
    section: 'Section',
    test: 'Test',
    kind: 'Kind',
    from: 'From (shop time)',
    to: 'To (shop time)',
    zone: 'Zone',
    lowestMargin: `Lowest dew margin (°${unit} difference)`,
    highestRh: 'Highest RH (%)',
    hoursWet: 'Hours wet (h)',
    timeOfWetness: 'Time of wetness (h)',
    treatment: 'Treatment',
    rank: 'Rank (1 = best)',
    note: 'Note',
    rankTotal: 'Rank total',
    meanRank: 'Mean rank',
    statistic: 'Friedman chi-square',
    df: 'Degrees of freedom',
    p: 'p',
    kendallW: "Kendall's W",
    comparedWith: 'Compared with',
    z: 'z',
    adjustedP: 'Holm-adjusted p',
    words: 'Words',
  };
  return TRIAL_CSV_COLUMNS.map((key) => ({ key, label: labels[key] }));
}
