/**
 * The care screens' small sums and words: a surface's state against its budget, hours and ages
 * as read on screen, surfaces grouped by zone, and the care entries as marks on the margin
 * chart. Pure: the current time is an argument.
 */
import type { CareEntry, Surface, SurfaceExposure } from '@/components/queries';
import {
  CARE_KIND_WORDS,
  COATING_TYPE_LABELS,
  RECOAT_STATE_WORDS,
  RUSTING_GRADE_WORDS,
  RUSTING_STANDARD,
} from '@/ingest/words';

export type RecoatState = keyof typeof RECOAT_STATE_WORDS;

/** No coat logged, a re-coat due (a budget passed), or within every budget. */
export function recoatState(exposure: Pick<SurfaceExposure, 'since' | 'recoat'>): RecoatState {
  if (exposure.since === null) return 'none';
  return exposure.recoat.due ? 'due' : 'ok';
}

export function recoatStateWord(state: RecoatState): string {
  return RECOAT_STATE_WORDS[state];
}

/** Hours to one decimal, as the re-coat sentence writes them; a dash without a coat. */
export function formatHours(hours: number | null): string {
  return hours === null ? '—' : `${hours.toFixed(1)} h`;
}

const MINUTE_MS = 60_000;
const HOUR_MS = 60 * MINUTE_MS;
const DAY_MS = 24 * HOUR_MS;

/** How long ago a coat went on: minutes within the hour, hours within two days, then days. */
export function formatAge(atIso: string, nowMs: number): string {
  const ageMs = Math.max(0, nowMs - Date.parse(atIso));
  if (ageMs < MINUTE_MS) return 'just now';
  if (ageMs < HOUR_MS) return `${Math.floor(ageMs / MINUTE_MS)} min ago`;
  if (ageMs < 2 * DAY_MS) return `${Math.floor(ageMs / HOUR_MS)} h ago`;
  return `${Math.floor(ageMs / DAY_MS)} days ago`;
}

/** "Coat · Paste wax · shop's own blend" or "Inspection · Ri 1 — …". */
export function careEntryTitle(entry: Pick<CareEntry, 'kind' | 'coating' | 'rusting'>): string {
  const parts = [CARE_KIND_WORDS[entry.kind]];
  if (entry.coating) {
    parts.push(COATING_TYPE_LABELS[entry.coating.type]);
    if (entry.coating.product) parts.push(entry.coating.product);
  }
  if (entry.rusting !== null) parts.push(rustingWords(entry.rusting));
  return parts.join(' · ');
}

/** The degree of rusting in words with the standard named: "Ri 0 — … (ISO 4628-3)". */
export function rustingWords(grade: CareEntry['rusting'] & number): string {
  return `${RUSTING_GRADE_WORDS[grade]} (${RUSTING_STANDARD})`;
}

export interface ZoneGroup<Z> {
  zone: Z;
  surfaces: Surface[];
}

/** Surfaces under their zones, in the zones' order, each zone's surfaces by name; empty zones left out. */
export function groupByZone<Z extends { id: string }>(
  zones: readonly Z[],
  surfaces: readonly Surface[],
): ZoneGroup<Z>[] {
  return zones
    .map((zone) => ({
      zone,
      surfaces: surfaces
        .filter((s) => s.zoneId === zone.id)
        .sort((a, b) => a.name.localeCompare(b.name)),
    }))
    .filter((group) => group.surfaces.length > 0);
}

/** The chart of a surface page spans 6 hours to 30 days. */
export const CHART_MIN_HOURS = 6;
export const CHART_MAX_HOURS = 30 * 24;

/**
 * Hours of history the surface chart shows: back to the oldest care entry and an hour before it,
 * so its mark is not on the edge; at least 6 and at most 30 days. Whole hours, so the window (and
 * its cache key) changes at most once an hour while the page is open.
 */
export function chartHours(entries: readonly Pick<CareEntry, 'at'>[], nowMs: number): number {
  const oldest = Math.min(nowMs, ...entries.map((e) => Date.parse(e.at)));
  const hours = Math.ceil((nowMs - oldest) / HOUR_MS) + 1;
  return Math.min(CHART_MAX_HOURS, Math.max(CHART_MIN_HOURS, hours));
}

export interface CareMark {
  atMs: number;
  kind: CareEntry['kind'];
  label: string;
}

/** Entries inside the chart's span as marks, oldest first (the list under the chart is newest first). */
export function careMarks(entries: readonly CareEntry[], fromMs: number, toMs: number): CareMark[] {
  return entries
    .map((e) => ({ atMs: Date.parse(e.at), kind: e.kind, label: careEntryTitle(e) }))
    .filter((m) => m.atMs >= fromMs && m.atMs <= toMs)
    .sort((a, b) => a.atMs - b.atMs);
}

/** The chart's marks in words, under it: how many, which shape is which, or why none show. */
export function marksLine(count: number, hasReadings: boolean): string {
  if (count === 0) return 'No coat or inspection in this span.';
  const entries = `${count} care ${count === 1 ? 'entry' : 'entries'}`;
  if (!hasReadings) return `${entries} in this span, but no readings to draw them over.`;
  return `${entries} marked: ▲ coat, ◆ inspection.`;
}
