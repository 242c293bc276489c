// The keyboard focus ring against the colours it is drawn beside, computed from theme.ts with
// WCAG 2.x's relative luminance and contrast ratio. Source of the thresholds: WCAG 2.2 SC 1.4.11
// (Non-text Contrast: 3:1 for what identifies a control's state) and SC 2.4.13 (Focus
// Appearance: an indicator at least 2 CSS px thick whose pixels change by at least 3:1).
import { describe, expect, it } from 'vitest';

import { colors, focusRing } from '@/components/theme';
import { contrastRatio, relativeLuminance } from '@/components/ui/contrast';
import { focusRingCss } from '@/components/ui/focusRingCss';

describe('contrastRatio (WCAG 2.x definition)', () => {
  it.each([
    // The formula's ends, from its definition: (1.05) / (0.05) = 21 and equal colours give 1.
    ['#000000', '#FFFFFF', 21],
    ['#FFFFFF', '#FFFFFF', 1],
    // Mid-grey #777777 on white is the usual "just misses 4.5:1" example: 4.48:1 (from memory;
    // the sRGB value 0x77 → 0.1845 linear, L = 0.1845, (1.05) / (0.2345) = 4.478).
    ['#777777', '#FFFFFF', 4.478],
  ])('%s against %s is %s:1', (a, b, expected) => {
    expect(contrastRatio(a, b)).toBeCloseTo(expected, 2);
    expect(contrastRatio(b, a)).toBeCloseTo(expected, 2);
  });

  it('refuses what is not a #RRGGBB colour', () => {
    expect(() => relativeLuminance('ink')).toThrow(/RRGGBB/);
  });
});

// Where a control stands (LOOK.md: the page is paper, cards and panels are card) and what fills
// a control (components/forms: a primary button is ink, iron while pressed or hovered; a chosen
// option is ink).
const BACKGROUNDS = { paper: colors.paper, card: colors.card };
const FILLS = { ink: colors.ink, iron: colors.iron, card: colors.card };

describe('the focus ring', () => {
  it('is at least 2 CSS px thick in each band (SC 2.4.13)', () => {
    expect(focusRing.bandPx).toBeGreaterThanOrEqual(2);
    expect(focusRingCss()).toContain(`outline: ${focusRing.bandPx}px solid ${focusRing.outer}`);
    expect(focusRingCss()).toContain(`0 0 0 ${focusRing.bandPx}px ${focusRing.inner}`);
  });

  it.each(Object.entries(BACKGROUNDS))(
    'its outer band contrasts at least 3:1 with the %s background (SC 1.4.11, 2.4.13)',
    (_, background) => {
      expect(contrastRatio(focusRing.outer, background)).toBeGreaterThanOrEqual(3);
    },
  );

  it.each(Object.entries(FILLS))(
    'one band next to a %s control contrasts at least 3:1 with it (SC 1.4.11)',
    (_, fill) => {
      // The inner band touches the control; on a light control it is the outer band that shows.
      const best = Math.max(
        contrastRatio(focusRing.inner, fill),
        contrastRatio(focusRing.outer, fill),
      );
      expect(best).toBeGreaterThanOrEqual(3);
    },
  );

  it('its two bands contrast at least 3:1 with each other, so the ring reads on a dark fill', () => {
    expect(contrastRatio(focusRing.inner, focusRing.outer)).toBeGreaterThanOrEqual(3);
  });
});
