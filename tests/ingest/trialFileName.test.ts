// The trial export's file name: letters and digits of the trial's name only, so it is safe in a
// Content-Disposition header (RFC 6266 quoted-string: no quotes or backslashes) and on every
// file system. Accents are dropped by Unicode canonical decomposition (NFKD, UAX #15).
import { describe, expect, it } from 'vitest';

import { trialFileName } from '@/ingest/words/trials';

describe('trialFileName', () => {
  it.each([
    ['Saw table protection', 'csv', 'trial-saw-table-protection-2026-03-02.csv'],
    ['Bänk "wax" vs. oil / 2', 'pdf', 'trial-bank-wax-vs-oil-2-2026-03-02.pdf'],
    ['../../etc/passwd', 'csv', 'trial-etc-passwd-2026-03-02.csv'],
    // Nothing left of the name: the date alone.
    ['Ранжир', 'csv', 'trial-2026-03-02.csv'],
    // Cut at 40 characters, with no hyphen left dangling at the cut.
    [`${'a'.repeat(39)} b`, 'csv', `trial-${'a'.repeat(39)}-2026-03-02.csv`],
  ] as const)('%s → %s', (name, format, expected) => {
    expect(trialFileName(name, '2026-03-02', format)).toBe(expected);
  });
});
