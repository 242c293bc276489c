/**
 * The overview's order: the zones that need a hand first. Wet zones, then close ones, then the
 * rest; within each, the smallest dew margin first (the nearest to condensing), ties and zones
 * without a margin by name. Zones with no margin at all (no surface data, no reading yet) come
 * last: nothing says they are at risk, and nothing says they are not.
 */
import type { Level } from '@/ingest/wire';

export interface RiskRanked {
  name: string;
  latest: { level: Level; margin: number | null } | null;
}

const LEVEL_RANK: Record<Level, number> = { wet: 0, close: 1, dry: 2, unknown: 3 };

/** The levels the overview's strip counts, worst first. */
export const STRIP_LEVELS = ['wet', 'close', 'dry', 'unknown'] as const satisfies Level[];

const levelOf = (zone: RiskRanked): Level => zone.latest?.level ?? 'unknown';

function marginOf(zone: RiskRanked): number | null {
  const margin = zone.latest?.margin;
  return margin === null || margin === undefined || !Number.isFinite(margin) ? null : margin;
}

export function compareByRisk(a: RiskRanked, b: RiskRanked): number {
  const byLevel = LEVEL_RANK[levelOf(a)] - LEVEL_RANK[levelOf(b)];
  if (byLevel !== 0) return byLevel;
  const ma = marginOf(a);
  const mb = marginOf(b);
  if (ma !== null && mb !== null && ma !== mb) return ma - mb;
  if (ma === null && mb !== null) return 1;
  if (mb === null && ma !== null) return -1;
  return a.name.localeCompare(b.name);
}

/** A new list in risk order; the given one is left as it was (it is the query cache's). */
export function orderByRisk<T extends RiskRanked>(zones: readonly T[]): T[] {
  return [...zones].sort(compareByRisk);
}

export interface LevelCount {
  level: Level;
  count: number;
}

/**
 * Zones per level for the strip, worst first. Wet, close and dry are always listed (a 0 wet is
 * news too); unknown only when some zone has no margin.
 */
export function countByLevel(zones: readonly RiskRanked[]): LevelCount[] {
  const counts: Record<Level, number> = { wet: 0, close: 0, dry: 0, unknown: 0 };
  for (const zone of zones) counts[levelOf(zone)] += 1;
  return STRIP_LEVELS.filter((level) => level !== 'unknown' || counts.unknown > 0).map((level) => ({
    level,
    count: counts[level],
  }));
}
