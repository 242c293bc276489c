import { describe, expect, it } from 'vitest';

import { isStale, postingInterval, zoneStaleAfterS } from '@/ingest';

// Our own rule (ingest/postingInterval.ts): silent after three intervals; a learnt or default
// interval never under 15 min of silence, a set one never under the sweep's minute.
describe('the posting interval in force and when a sensor counts as silent', () => {
  it.each<[string, number | null, number | null, number, string, number]>([
    ['nothing known: 5 min default, 15 min', null, null, 300, 'default', 900],
    ['learnt 60 s: floor of 15 min', null, 60, 60, 'learned', 900],
    ['learnt 6 min: 3 × 6 = 18 min', null, 360, 360, 'learned', 1080],
    ['set 60 s wins over learnt 600 s: 3 min', 60, 600, 60, 'set', 180],
    ['set 10 s: the sweep minute', 10, null, 10, 'set', 60],
    ['set 1 day: 3 days', 86_400, 60, 86_400, 'set', 259_200],
    ['a learnt 0 is unknown', null, 0, 300, 'default', 900],
  ])('%s', (_name, setS, learnedS, effectiveS, source, silentAfterS) => {
    expect(postingInterval(setS, learnedS)).toEqual({ effectiveS, source, silentAfterS });
  });

  it('makes a zone stale only when its most patient sensor would be silent', () => {
    expect(zoneStaleAfterS([])).toBe(900);
    expect(
      zoneStaleAfterS([
        { setS: 60, learnedS: null },
        { setS: null, learnedS: 600 },
      ]),
    ).toBe(1800);
    expect(isStale(0, 180, 180_000)).toBe(false);
    expect(isStale(0, 180, 180_001)).toBe(true);
  });
});
