import { describe, expect, it } from 'vitest';

import { getBreakpoints } from '@/components/layout/breakpoints';

describe('getBreakpoints', () => {
  it.each([
    [390, false, false],
    [640, true, false],
    [1023, true, false],
    [1024, true, true],
    [1440, true, true],
  ])('%i px: medium %s, wide %s', (width, isMedium, isWide) => {
    expect(getBreakpoints(width)).toMatchObject({ isMedium, isWide });
  });
});
