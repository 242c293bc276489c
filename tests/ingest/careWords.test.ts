// The care log's words and rule (ingest/words/care.ts, ingest/care.ts): every coating type and
// every ISO 4628-3 rusting grade has words, the re-coat advice carries the cautions the project's
// rules ask for wherever a person coats the iron, and the budget rule picks the first budget
// passed in order of harm.
import { describe, expect, it } from 'vitest';

import { DEFAULT_COATING_BUDGETS, recoatCause } from '../../ingest/care';
import { COATING_TYPES, RUSTING_GRADES } from '../../ingest/wire/surfaces';
import {
  COATING_TYPE_LABELS,
  RECOAT_CAUTIONS,
  recoatReason,
  RUSTING_GRADE_WORDS,
  RUSTING_STANDARD,
} from '../../ingest/words/care';

describe('rusting grades', () => {
  // ISO 4628-3 runs from Ri 0 to Ri 5; each grade's words name it as the standard does.
  it('has words for Ri 0 to Ri 5 and no other grade', () => {
    expect(RUSTING_GRADES).toEqual([0, 1, 2, 3, 4, 5]);
    expect(Object.keys(RUSTING_GRADE_WORDS).map(Number)).toEqual([0, 1, 2, 3, 4, 5]);
    for (const grade of RUSTING_GRADES) {
      expect(RUSTING_GRADE_WORDS[grade].startsWith(`Ri ${grade} — `)).toBe(true);
    }
    expect(RUSTING_STANDARD).toBe('ISO 4628-3');
  });

  // The standard grades by rusted share of the area, growing with the grade (Ri 0 none).
  it('describes a larger rusted share at each higher grade', () => {
    expect(RUSTING_GRADE_WORDS[0]).toMatch(/no rust/);
    const shares = [1, 2, 3, 4, 5].map((g) => {
      const m = /about ([\d.]+)/.exec(RUSTING_GRADE_WORDS[g as 1]);
      return Number(m?.[1]);
    });
    expect(shares).toEqual([0.05, 0.5, 1, 8, 40]);
  });
});

describe('coating types', () => {
  it('names every coating type and gives each a default budget', () => {
    expect(Object.keys(COATING_TYPE_LABELS).sort()).toEqual([...COATING_TYPES].sort());
    expect(Object.keys(DEFAULT_COATING_BUDGETS).sort()).toEqual([...COATING_TYPES].sort());
  });
});

describe('re-coat advice', () => {
  // The project's rule for advice that has a person coat the iron: unplug, the label and safety
  // data sheet, ventilation, oily rags (spread flat to dry or a closed metal container with
  // water), and deference to the maker's instructions and local fire codes.
  it('carries every caution a coat needs', () => {
    const all = RECOAT_CAUTIONS.join(' ');
    expect(all).toMatch(/unplug/i);
    expect(all).toMatch(/label and safety data sheet/);
    expect(all).toMatch(/Ventilate/);
    expect(all).toMatch(/self-heat/);
    expect(all).toMatch(/lay them flat to dry/);
    expect(all).toMatch(/closed metal container with water/);
    expect(all).toMatch(/maker’s instructions and your local fire codes/);
  });

  const budget = { hoursWet: 4, hoursClose: 72, towHours: 500 };
  it.each([
    // [exposure, cause]: the budget is passed only when strictly above it.
    [{ hoursWet: 4, hoursClose: 72, towHours: 500 }, 'none'],
    [{ hoursWet: 4.01, hoursClose: 0, towHours: 0 }, 'wet'],
    [{ hoursWet: 0, hoursClose: 72.5, towHours: 0 }, 'close'],
    [{ hoursWet: 0, hoursClose: 0, towHours: 501 }, 'tow'],
    // All three passed: wet is named, condensation being the worst of them.
    [{ hoursWet: 5, hoursClose: 80, towHours: 600 }, 'wet'],
    [null, 'no_coat'],
  ] as const)('%j → %s', (exposure, cause) => {
    expect(recoatCause(exposure, budget)).toBe(cause);
  });

  it('says which budget was passed, with both figures in hours', () => {
    expect(
      recoatReason({
        cause: 'close',
        coating: 'inhibitor_spray',
        exposure: { hoursWet: 0, hoursClose: 250.04, towHours: 3 },
        budget: { hoursWet: 12, hoursClose: 240, towHours: 1500 },
      }),
    ).toBe(
      'Re-coat suggested: close to the dew point for 250.0 h since the corrosion-inhibitor spray, more than its budget of 240.0 h.',
    );
  });
});
