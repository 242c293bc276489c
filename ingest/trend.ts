/**
 * Early warning of dew: fit the recent dew-margin series and, when it is falling and would reach
 * the wet limit within the look-ahead, say in how many minutes.
 *
 * Fit: the Theil–Sen estimator (Theil 1950; Sen 1968). The slope is the median of the slopes of
 * all pairs of points, the intercept the median of yᵢ − slope·xᵢ. Its breakdown point is 29 %: one
 * outlier among n points touches n − 1 of the n(n − 1)/2 pair slopes, fewer than half once n ≥ 5,
 * so the median stays inside the range of the clean slopes. Least squares would follow the spike.
 * Cost is O(n² log n); `maxSamples` keeps the newest points so a fast sensor cannot make it
 * expensive.
 *
 * Valid range: any finite margins. The projection is a straight line; it is only trusted over a
 * look-ahead comparable to the window it was fitted on, hence the defaults below.
 */

export interface MarginSample {
  atMs: number;
  marginK: number | null;
}

export interface TrendOptions {
  /** The current time; samples after it are ignored. */
  nowMs: number;
  /** How far back the fit reaches. */
  windowMs: number;
  /** Fewest samples that make a fit. */
  minSamples: number;
  /** Shortest time the samples must span, so two readings a second apart cannot extrapolate. */
  minSpanMs: number;
  /** Most (newest) samples used. */
  maxSamples: number;
}

const MINUTE_MS = 60_000;

/**
 * Our own choices, not from a standard: 30 min covers a morning warm-up, when the air's dew point
 * rises faster than the iron warms, while still forgetting yesterday's evening; five samples
 * spanning 10 min is the least that shows a direction on a 1–2 min sensor interval.
 */
export const DEFAULT_TREND: Omit<TrendOptions, 'nowMs'> = {
  windowMs: 30 * MINUTE_MS,
  minSamples: 5,
  minSpanMs: 10 * MINUTE_MS,
  maxSamples: 120,
};

/** Look-ahead for the dew-risk alarm (DESIGN.md default): an hour is time to heat or cover. */
export const DEFAULT_LOOK_AHEAD_MS = 60 * MINUTE_MS;

export interface LineFit {
  slope: number;
  intercept: number;
}

/**
 * Moves the k-th smallest value (from 0) to `a[k]`, smaller or equal ones before it, larger or
 * equal after, and returns it: Hoare's selection with a median-of-three pivot (as in Press et al.,
 * Numerical Recipes, "select"). O(n) on average against the sort's O(n log n); for the 7,140 pair
 * slopes of a full window that is the fit's main cost, once per minute of data per zone.
 */
function select(a: Float64Array, k: number): number {
  const swap = (i: number, j: number) => {
    const t = a[i]!;
    a[i] = a[j]!;
    a[j] = t;
  };
  let lo = 0;
  let hi = a.length - 1;
  for (;;) {
    if (hi <= lo + 1) {
      if (hi === lo + 1 && a[hi]! < a[lo]!) swap(lo, hi);
      return a[k]!;
    }
    swap((lo + hi) >> 1, lo + 1);
    if (a[lo]! > a[hi]!) swap(lo, hi);
    if (a[lo + 1]! > a[hi]!) swap(lo + 1, hi);
    if (a[lo]! > a[lo + 1]!) swap(lo, lo + 1);
    // a[lo] <= pivot <= a[hi] act as sentinels for the two scans.
    const pivot = a[lo + 1]!;
    let i = lo + 1;
    let j = hi;
    for (;;) {
      do i++;
      while (a[i]! < pivot);
      do j--;
      while (a[j]! > pivot);
      if (j < i) break;
      swap(i, j);
    }
    a[lo + 1] = a[j]!;
    a[j] = pivot;
    if (j >= k) hi = j - 1;
    if (j <= k) lo = i;
  }
}

/** The median, as sorting would give it (the mean of the middle two for an even count). */
function median(values: Float64Array): number {
  const mid = values.length >> 1;
  if (values.length % 2 === 1) return select(values, mid);
  const below = select(values, mid - 1);
  // Everything after index mid - 1 is now at least `below`: its smallest is the upper middle.
  let above = Infinity;
  for (let i = mid; i < values.length; i++) if (values[i]! < above) above = values[i]!;
  return (below + above) / 2;
}

/** Theil–Sen line through (xs[i], ys[i]); null with fewer than two distinct x values. */
export function theilSen(xs: readonly number[], ys: readonly number[]): LineFit | null {
  const n = Math.min(xs.length, ys.length);
  const slopes = new Float64Array((n * (n - 1)) / 2);
  let count = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const dx = xs[j]! - xs[i]!;
      // Pairs at the same time carry no slope; skipping them is Sen's own rule.
      if (dx !== 0) slopes[count++] = (ys[j]! - ys[i]!) / dx;
    }
  }
  if (count === 0) return null;
  const slope = median(slopes.subarray(0, count));
  const offsets = new Float64Array(n);
  for (let i = 0; i < n; i++) offsets[i] = ys[i]! - slope * xs[i]!;
  return { slope, intercept: median(offsets) };
}

export interface MarginTrend {
  /** Fitted rate of change, K per minute; negative when the margin is closing. */
  slopeKPerMin: number;
  /** The fitted margin at `nowMs`, K; less noisy than the last reading. */
  marginNowK: number;
  sampleCount: number;
  spanMs: number;
}

/** Theil–Sen fit of the margin over the window ending at `nowMs`; null when data are too thin. */
export function fitMarginTrend(
  samples: readonly MarginSample[],
  options: Pick<TrendOptions, 'nowMs'> & Partial<TrendOptions>,
): MarginTrend | null {
  const { nowMs, windowMs, minSamples, minSpanMs, maxSamples } = { ...DEFAULT_TREND, ...options };
  const recent = samples
    .filter(
      (s): s is { atMs: number; marginK: number } =>
        s.marginK !== null &&
        Number.isFinite(s.marginK) &&
        s.atMs <= nowMs &&
        s.atMs >= nowMs - windowMs,
    )
    .sort((a, b) => a.atMs - b.atMs)
    .slice(-maxSamples);
  if (recent.length < Math.max(2, minSamples)) return null;
  const spanMs = recent[recent.length - 1]!.atMs - recent[0]!.atMs;
  if (spanMs < minSpanMs) return null;
  // Minutes relative to now keep the numbers small (epoch ms squared would lose digits) and make
  // the intercept the fitted margin at now.
  const fit = theilSen(
    recent.map((s) => (s.atMs - nowMs) / MINUTE_MS),
    recent.map((s) => s.marginK),
  );
  if (fit === null) return null;
  return {
    slopeKPerMin: fit.slope,
    marginNowK: fit.intercept,
    sampleCount: recent.length,
    spanMs,
  };
}

export interface EarlyWarningOptions extends Partial<TrendOptions> {
  nowMs: number;
  /** The zone's wet limit, K. */
  wetK: number;
  lookAheadMs?: number;
}

/**
 * Minutes until the fitted margin reaches the wet limit, when it is falling and gets there within
 * the look-ahead; 0 when the fit is already at or below the limit and still falling; otherwise
 * null (rising or flat, too far off, or too little data).
 */
export function minutesToWet(
  samples: readonly MarginSample[],
  options: EarlyWarningOptions,
): number | null {
  const { wetK, lookAheadMs = DEFAULT_LOOK_AHEAD_MS, ...trendOptions } = options;
  const trend = fitMarginTrend(samples, trendOptions);
  if (trend === null || !(trend.slopeKPerMin < 0)) return null;
  if (trend.marginNowK <= wetK) return 0;
  const minutes = (wetK - trend.marginNowK) / trend.slopeKPerMin;
  return minutes <= lookAheadMs / MINUTE_MS ? minutes : null;
}
