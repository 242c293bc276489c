/**
 * The trial the browser and export tests rank: 4 treatments × 5 tests, no ties (1 = best).
 * Rank totals 6, 10, 15, 19 (the columns' sums, n = 5 tests, k = 4).
 * Friedman (Friedman 1937; Conover, Practical Nonparametric Statistics, 3rd ed., §5.8):
 * χ² = 12 / (n k (k + 1)) · ΣR² − 3 n (k + 1) = 12/100 · (36 + 100 + 225 + 361) − 75 = 11.64,
 * df = k − 1 = 3; p = P(χ²₃ > 11.64) = erfc(√5.82) + √(2·11.64/π)·e^(−5.82) = 0.008724
 * (the χ² survival function for 3 df, closed form). Kendall's W = χ² / (n (k − 1)) = 11.64 / 15
 * = 0.776 (Kendall & Babington Smith 1939).
 */
export const WORKED_RANKS: readonly (readonly number[])[] = [
  [1, 2, 3, 4],
  [1, 3, 2, 4],
  [1, 2, 4, 3],
  [2, 1, 3, 4],
  [1, 2, 3, 4],
];

export const WORKED = {
  totals: [6, 10, 15, 19],
  statistic: 11.64,
  df: 3,
  p: 0.008724,
  kendallW: 0.776,
} as const;
