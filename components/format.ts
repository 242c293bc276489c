/**
 * How numbers and times read on screen. Numbers are formatted by ingest/words (the same words
 * the alarm e-mails use); times are formatted here, in the shop's zone. Pure functions: the
 * current time is passed in.
 */
import { formatInTimeZone } from 'date-fns-tz';

import { MISSING } from '@/ingest/words';

// The words folder, not '@/ingest': the package index would bring zod into the web bundle.
export {
  deltaInUnit,
  formatMargin,
  formatPercent,
  formatTemperature,
  formatVolts,
  MISSING,
} from '@/ingest/words';

/**
 * When a zone was last heard from: "just now", "2 min ago", "3 h ago" within the day, then
 * the shop's local date and time.
 */
export function formatLastSeen(atIso: string, nowMs: number, timeZone: string): string {
  const atMs = Date.parse(atIso);
  if (Number.isNaN(atMs)) return MISSING;
  const ageS = Math.max(0, Math.round((nowMs - atMs) / 1000));
  if (ageS < 60) return 'just now';
  const ageMin = Math.floor(ageS / 60);
  if (ageMin < 60) return `${ageMin} min ago`;
  const ageH = Math.floor(ageMin / 60);
  if (ageH < 12) return `${ageH} h ago`;
  return formatInTimeZone(atMs, timeZone, 'd MMM HH:mm');
}
