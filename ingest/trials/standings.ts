/**
 * A protection trial's standings: each test ranks every treatment (1 = best), and the
 * standings say which treatment ranked best overall and whether the differences are more than
 * chance. Pure: the ranks in, the figures out.
 *
 * - The Friedman test with the tie correction, in Conover's form (W. J. Conover, Practical
 *   Nonparametric Statistics, 3rd ed., Wiley 1999, section 5.8): with b tests, k treatments,
 *   R_j the rank total of treatment j, A = Σ r² over all ranks and C = b·k·(k+1)²/4,
 *   T = (k − 1)·Σ_j (R_j − b(k+1)/2)² / (A − C). Without ties A − C = b·k(k+1)(k−1)/12 and T is
 *   the textbook 12/(b k (k+1)) Σ R_j² − 3 b (k+1); with ties the same form is the corrected one.
 *   p is the chi-square upper tail with k − 1 degrees of freedom, computed as the regularized
 *   upper incomplete gamma Q(df/2, T/2) directly: 1 − cdf underflows to 0 for large T.
 * - Kendall's W (coefficient of concordance), tie-corrected: W = T / (b (k − 1)), which equals
 *   12 S / (b²(k³ − k) − b Σ(t³ − t)) (M. G. Kendall, Rank Correlation Methods).
 * - Pairwise comparisons only when the overall test says p < 0.05: the mean-rank difference over
 *   its standard error sqrt(k(k+1)/(6b)) as a normal z, two-sided, with Holm's step-down
 *   adjustment — the procedure J. Demšar recommends after a significant Friedman test
 *   ("Statistical Comparisons of Classifiers over Multiple Data Sets", JMLR 7, 2006, section
 *   3.2.2; quoted from memory). The standard error ignores ties, which makes it a little
 *   conservative when tests tie treatments.
 */
import gammainc from '@stdlib/math-base-special-gammainc';

/** Below this p the overall differences count as more than chance (the usual 5 % level). */
export const SIGNIFICANCE_P = 0.05;

/**
 * Fewer tests than this and the chi-square tail is only a rough guide to Friedman's exact
 * distribution (exact tables exist for few tests and treatments). A rule of thumb of ours, not a
 * standard's value: the standings still show, with a caution.
 */
export const MIN_TESTS_FOR_CONFIDENCE = 6;

/** Chi-square upper tail P(X ≥ x) with df degrees of freedom. */
export function chiSquareUpperTail(x: number, df: number): number {
  if (!(x > 0)) return 1;
  return gammainc(x / 2, df / 2, true, true);
}

/** Two-sided normal tail P(|Z| ≥ |z|): Z² is chi-square with one degree of freedom. */
export function normalTwoSidedP(z: number): number {
  return chiSquareUpperTail(z * z, 1);
}

/**
 * The ranks of one test as average ranks: the lowest value is rank 1 (best) and tied values
 * share the mean of the ranks they span, so [1, 1, 3] and [1, 1, 2] both become [1.5, 1.5, 3].
 */
export function averageRanks(values: readonly number[]): number[] {
  const order = values.map((value, index) => ({ value, index })).sort((a, b) => a.value - b.value);
  const ranks = new Array<number>(values.length);
  let start = 0;
  while (start < order.length) {
    let end = start;
    while (end + 1 < order.length && order[end + 1]!.value === order[start]!.value) end += 1;
    // Positions start..end (0-based) hold ranks start+1..end+1; each gets their mean.
    const shared = (start + end) / 2 + 1;
    for (let i = start; i <= end; i += 1) ranks[order[i]!.index] = shared;
    start = end + 1;
  }
  return ranks;
}

export interface RankTotal {
  /** Position of the treatment in the input. */
  treatment: number;
  total: number;
  meanRank: number;
}

export interface FriedmanResult {
  statistic: number;
  df: number;
  p: number;
}

export interface PairComparison {
  /** Treatment positions, `better` with the lower mean rank. */
  better: number;
  worse: number;
  z: number;
  /** Unadjusted two-sided p. */
  p: number;
  /** Holm-adjusted p (monotone, at most 1). */
  adjustedP: number;
  differs: boolean;
}

export interface Standings {
  treatments: number;
  tests: number;
  rankTotals: RankTotal[];
  friedman: FriedmanResult | null;
  kendallW: number | null;
  /** Empty unless the Friedman test says p < SIGNIFICANCE_P. */
  pairs: PairComparison[];
}

/**
 * Standings from each test's ranks (one row per test, one entry per treatment, lower = better;
 * ties allowed). Rows are re-ranked to average ranks first. The Friedman test needs two tests
 * and some test that does not tie everything; otherwise it is null.
 */
export function trialStandings(
  rows: readonly (readonly number[])[],
  treatments: number,
): Standings {
  if (treatments < 2) throw new RangeError('A trial compares at least two treatments');
  for (const row of rows) {
    if (row.length !== treatments) throw new RangeError('Each test ranks every treatment');
  }
  const b = rows.length;
  const k = treatments;
  const ranked = rows.map(averageRanks);
  const totals = new Array<number>(k).fill(0);
  let sumSquares = 0;
  for (const row of ranked) {
    row.forEach((rank, j) => {
      totals[j] = totals[j]! + rank;
      sumSquares += rank * rank;
    });
  }
  const rankTotals = totals.map((total, treatment) => ({
    treatment,
    total,
    meanRank: b === 0 ? 0 : total / b,
  }));

  const expected = (b * (k + 1)) / 2;
  const spread = totals.reduce((sum, total) => sum + (total - expected) ** 2, 0);
  const denominator = sumSquares - (b * k * (k + 1) ** 2) / 4;
  // 1e-9: A − C is a sum of squares of halves; round-off below that means every test tied all.
  if (b < 2 || denominator <= 1e-9) {
    return { treatments: k, tests: b, rankTotals, friedman: null, kendallW: null, pairs: [] };
  }
  const statistic = ((k - 1) * spread) / denominator;
  const df = k - 1;
  const p = chiSquareUpperTail(statistic, df);
  const kendallW = Math.min(1, statistic / (b * (k - 1)));
  const pairs = p < SIGNIFICANCE_P ? holmPairs(rankTotals, b, k) : [];
  return { treatments: k, tests: b, rankTotals, friedman: { statistic, df, p }, kendallW, pairs };
}

function holmPairs(rankTotals: readonly RankTotal[], b: number, k: number): PairComparison[] {
  const standardError = Math.sqrt((k * (k + 1)) / (6 * b));
  const pairs: Omit<PairComparison, 'adjustedP' | 'differs'>[] = [];
  for (let i = 0; i < k; i += 1) {
    for (let j = i + 1; j < k; j += 1) {
      const a = rankTotals[i]!;
      const c = rankTotals[j]!;
      const [better, worse] = a.meanRank <= c.meanRank ? [a, c] : [c, a];
      const z = (worse.meanRank - better.meanRank) / standardError;
      pairs.push({ better: better.treatment, worse: worse.treatment, z, p: normalTwoSidedP(z) });
    }
  }
  // Holm: the i-th smallest p (0-based) is multiplied by m − i, kept monotone; a pair differs
  // while every smaller adjusted p stays below the level.
  const m = pairs.length;
  const byP = [...pairs].sort((x, y) => x.p - y.p);
  let running = 0;
  const adjusted = new Map<(typeof pairs)[number], number>();
  byP.forEach((pair, i) => {
    running = Math.max(running, Math.min(1, (m - i) * pair.p));
    adjusted.set(pair, running);
  });
  return byP.map((pair) => {
    const adjustedP = adjusted.get(pair)!;
    return { ...pair, adjustedP, differs: adjustedP < SIGNIFICANCE_P };
  });
}
