/**
 * Shop time zones: IANA names as the runtime's own time-zone database (ICU, behind Intl) knows
 * them, spelt exactly — "America/Chicago", never "america/chicago", since the name is shown back
 * to people, sent in mail and compared as text. The server's check and the app's picker use the
 * same rule, so what the picker offers the server accepts.
 *
 * Intl.supportedValuesOf('timeZone') lists each zone once under ICU's canonical name, which for
 * a few renamed zones is the older IANA spelling (Node 20: "Asia/Calcutta", "Europe/Kiev"),
 * while a newer browser reports the current one ("Asia/Kolkata", "Europe/Kyiv"). Both spellings
 * are real IANA names, so a name Intl accepts but does not list passes when it is spelt the
 * way IANA spells names (each part capitalised) — a case variant of a listed name never does.
 */

/** The zone every runtime knows; Node's list leaves it out. */
export const UTC_ZONE = 'UTC';

/** Every IANA zone this runtime lists, plus UTC, sorted. */
export function timeZoneNames(): string[] {
  let names: string[] = [];
  try {
    names = Intl.supportedValuesOf('timeZone');
  } catch {
    // A runtime without supportedValuesOf (old engines): UTC is still a choice.
  }
  return names.includes(UTC_ZONE) ? [...names] : [...names, UTC_ZONE].sort();
}

let listed: Map<string, string> | null = null;

/** Listed names by their lower-case spelling, made once. */
function listedByLowerCase(): Map<string, string> {
  listed ??= new Map(timeZoneNames().map((name) => [name.toLowerCase(), name]));
  return listed;
}

/** What Intl makes of a name, or null when it does not know it. */
function resolvedZone(name: string): string | null {
  try {
    return new Intl.DateTimeFormat('en', { timeZone: name }).resolvedOptions().timeZone;
  } catch {
    return null;
  }
}

// IANA's own spelling of a location part: a capital, then lower-case letters, parts joined by
// "_" or "-" ("Ho_Chi_Minh", "Kyiv"). Names with other shapes (Etc/GMT+5, Port-au-Prince) are
// all listed, so this only has to admit the renamed few.
const IANA_PART = /^[A-Z][a-z]+(?:[_-][A-Z][a-z]+)*$/;

export type TimeZoneCheck = { ok: true } | { ok: false; suggestion: string | null };

/**
 * Whether `name` is a time zone the runtime knows, spelt exactly as IANA spells it; when it is
 * not, the spelling it was probably meant as ("america/chicago" → "America/Chicago").
 */
export function checkTimeZone(name: string): TimeZoneCheck {
  const byLower = listedByLowerCase();
  const listedSpelling = byLower.get(name.toLowerCase());
  if (listedSpelling !== undefined) {
    return listedSpelling === name ? { ok: true } : { ok: false, suggestion: listedSpelling };
  }
  const resolved = resolvedZone(name);
  if (resolved === null) return { ok: false, suggestion: null };
  if (name.includes('/') && name.split('/').every((part) => IANA_PART.test(part))) {
    return { ok: true };
  }
  // An alias in another case, or an old name such as "US/Eastern": offer what it stands for.
  return { ok: false, suggestion: byLower.get(resolved.toLowerCase()) ?? resolved };
}

/** `name` as IANA spells it when it is a near miss with one meaning, else `name` unchanged. */
export function canonicalTimeZone(name: string): string {
  const check = checkTimeZone(name);
  return check.ok ? name : (check.suggestion ?? name);
}

/**
 * Zones matching what a person typed, best first: a match at the start of the city ("Chi" →
 * America/Chicago) before one anywhere in the name; spaces count as underscores ("New York").
 */
export function searchTimeZones(names: readonly string[], typed: string): string[] {
  const query = typed.trim().toLowerCase().replace(/\s+/g, '_');
  if (!query) return [...names];
  const city = (name: string) => (name.split('/').at(-1) ?? name).toLowerCase();
  const starts: string[] = [];
  const contains: string[] = [];
  for (const name of names) {
    const lower = name.toLowerCase();
    if (city(name).startsWith(query) || lower.startsWith(query)) starts.push(name);
    else if (lower.includes(query)) contains.push(name);
  }
  return [...starts, ...contains];
}
