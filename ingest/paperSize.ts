/**
 * The sheet a new shop's week report starts on. ISO 216 A4 is the paper of nearly every country;
 * the United States and Canada print on ANSI letter (8.5 × 11 in), so a shop whose time zone is
 * one of theirs starts on letter. The owner can change it (PATCH /shops/:shopId `paperSize`).
 *
 * The zones are those IANA's zone.tab assigns to US and CA, with the older names Node's ICU
 * still lists for them ("America/Indianapolis", "US/Eastern", "Canada/Atlantic"). Not a plain
 * "America/*": most of Central and South America and the Caribbean use A4. A few other places
 * also print on letter (Mexico, the Philippines, parts of Latin America); their shops start on
 * A4 and switch in the settings — a wrong guess there costs one tap, a wrong rule for a whole
 * continent would cost many.
 */
import type { PaperSize } from './wire/reports';

/** Whole sub-trees of IANA names that lie in the US or Canada. */
const LETTER_PREFIXES = [
  'US/',
  'Canada/',
  'America/Indiana/',
  'America/Kentucky/',
  'America/North_Dakota/',
] as const;

/** Single IANA names in the US (incl. Alaska and Hawaii) or Canada. */
export const LETTER_TIME_ZONES: readonly string[] = [
  // United States
  'America/New_York',
  'America/Detroit',
  'America/Chicago',
  'America/Menominee',
  'America/Denver',
  'America/Boise',
  'America/Phoenix',
  'America/Los_Angeles',
  'America/Anchorage',
  'America/Juneau',
  'America/Sitka',
  'America/Metlakatla',
  'America/Yakutat',
  'America/Nome',
  'America/Adak',
  'America/Indianapolis',
  'America/Fort_Wayne',
  'America/Louisville',
  'America/Knox_IN',
  'America/Shiprock',
  'America/Atka',
  'Pacific/Honolulu',
  // Canada
  'America/St_Johns',
  'America/Halifax',
  'America/Glace_Bay',
  'America/Moncton',
  'America/Goose_Bay',
  'America/Toronto',
  'America/Montreal',
  'America/Nipigon',
  'America/Thunder_Bay',
  'America/Iqaluit',
  'America/Pangnirtung',
  'America/Winnipeg',
  'America/Rainy_River',
  'America/Resolute',
  'America/Rankin_Inlet',
  'America/Regina',
  'America/Swift_Current',
  'America/Edmonton',
  'America/Yellowknife',
  'America/Cambridge_Bay',
  'America/Inuvik',
  'America/Dawson_Creek',
  'America/Fort_Nelson',
  'America/Creston',
  'America/Whitehorse',
  'America/Dawson',
  'America/Vancouver',
  'America/Atikokan',
  'America/Coral_Harbour',
  'America/Blanc-Sablon',
];

const LETTER_ZONES = new Set(LETTER_TIME_ZONES);

/** Letter for a US or Canadian time zone, A4 everywhere else. */
export function defaultPaperSize(timeZone: string): PaperSize {
  if (LETTER_ZONES.has(timeZone)) return 'letter';
  return LETTER_PREFIXES.some((prefix) => timeZone.startsWith(prefix)) ? 'letter' : 'a4';
}
