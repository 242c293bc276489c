/** Small summaries of measured samples. */

/** The p-th percentile (0–100) by nearest rank; NaN for no samples. */
export function percentile(sortedAsc: readonly number[], p: number): number {
  if (sortedAsc.length === 0) return Number.NaN;
  const rank = Math.ceil((p / 100) * sortedAsc.length);
  return sortedAsc[Math.min(sortedAsc.length, Math.max(1, rank)) - 1]!;
}

export interface LatencySummary {
  count: number;
  p50Ms: number;
  p99Ms: number;
  maxMs: number;
}

export function summarize(samplesMs: readonly number[]): LatencySummary {
  const sorted = Float64Array.from(samplesMs).sort();
  const asArray = Array.from(sorted);
  return {
    count: asArray.length,
    p50Ms: percentile(asArray, 50),
    p99Ms: percentile(asArray, 99),
    maxMs: asArray.at(-1) ?? Number.NaN,
  };
}

export const round = (value: number, digits = 1) => {
  const f = 10 ** digits;
  return Math.round(value * f) / f;
};
