// A new shop's report paper from its time zone: ANSI letter in the United States and Canada,
// ISO 216 A4 elsewhere. Countries per zone from IANA tzdata's zone.tab (country code column).
import { describe, expect, it } from 'vitest';

import { defaultPaperSize, LETTER_TIME_ZONES } from '@/ingest/paperSize';

describe('defaultPaperSize', () => {
  it.each([
    ['America/Chicago', 'letter'], // US
    ['America/New_York', 'letter'], // US
    ['America/Indiana/Knox', 'letter'], // US, a sub-tree
    ['America/North_Dakota/Beulah', 'letter'], // US, a sub-tree
    ['America/Anchorage', 'letter'], // US, Alaska
    ['Pacific/Honolulu', 'letter'], // US, Hawaii: not under America/
    ['US/Eastern', 'letter'], // an old link to America/New_York
    ['America/Toronto', 'letter'], // CA
    ['America/St_Johns', 'letter'], // CA, Newfoundland
    ['America/Vancouver', 'letter'], // CA
    ['Canada/Atlantic', 'letter'], // an old link to America/Halifax
    ['America/Sao_Paulo', 'a4'], // BR: under America/ but A4
    ['America/Argentina/Buenos_Aires', 'a4'], // AR
    ['America/Bogota', 'a4'], // CO: prints on letter too, but outside the US/Canada rule
    ['America/Nuuk', 'a4'], // GL
    ['Europe/Berlin', 'a4'],
    ['Australia/Sydney', 'a4'],
    ['UTC', 'a4'],
  ] as const)('%s → %s', (timeZone, paper) => {
    expect(defaultPaperSize(timeZone)).toBe(paper);
  });

  it('names only zones the runtime knows (a typo would silently fall back to A4)', () => {
    for (const timeZone of LETTER_TIME_ZONES) {
      expect(() => new Intl.DateTimeFormat('en', { timeZone }), timeZone).not.toThrow();
    }
  });
});
