/**
 * The words of a protection trial's standings: who ranked best, whether the differences are
 * more than chance, and the caution when there are too few tests to tell.
 */
import type { TrialTestKind } from '../wire/trials';
import { MIN_TESTS_FOR_CONFIDENCE, SIGNIFICANCE_P, type Standings } from '../trials/standings';

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
