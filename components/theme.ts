/**
 * Drybench's colours, type and spacing (see LOOK.md). Every level colour is paired with its
 * word wherever it is shown; colour alone never carries a level.
 */
import type { TextStyle, ViewStyle } from 'react-native';

import type { Level } from '@/ingest';
import { LEVEL_WORDS } from '@/ingest/words/levels';

import { fontFamily } from './fontFamily';

export const colors = {
  paper: '#F5F2EA',
  card: '#FFFDF8',
  border: '#E2DCCF',
  ink: '#1F2427',
  iron: '#56626B',
  air: '#2C6E91',
  dew: '#7A5AA6',
  dry: '#2E7A57',
  close: '#8F6210',
  wet: '#A5402D',
  unknown: '#656C73',
} as const;

/**
 * A stale zone card (its newest reading older than its sensors' silent threshold): greyed paper,
 * a grey rule and iron figures. Every text colour used on it keeps ≥ 4.5:1 on `card` (iron 5.4,
 * unknown 4.6, ink 13.5), so greying never costs legibility — unlike opacity on the text.
 */
export const staleColors = {
  card: '#F0EEE9',
  border: '#D9D4CA',
  rule: '#A3A8AC',
  figure: colors.iron,
} as const;

export const levelColors: Record<Level, string> = {
  dry: colors.dry,
  close: colors.close,
  wet: colors.wet,
  unknown: colors.unknown,
};

/** The word shown beside a level's colour, in sentence case (the words live in ingest/words). */
export const levelWords: Record<Level, string> = LEVEL_WORDS;

/**
 * The faces registered by useFonts in AppProviders (their names double as CSS font-family names),
 * with a fallback on the web while they load (fontFamily.web.ts).
 */
export const fonts = {
  regular: fontFamily('JetBrainsMono_400Regular'),
  medium: fontFamily('JetBrainsMono_500Medium'),
  bold: fontFamily('JetBrainsMono_700Bold'),
} as const;

/**
 * The keyboard focus ring, two-tone so it shows on anything: an inner band of card paper right
 * at the control's edge and an outer band of ink around it. On a light page the ink band stands
 * out; on a filled dark control (a primary button, a selected option) the paper band does.
 * tests/components/focusRing.test.ts computes both contrasts (WCAG 2.2 SC 1.4.11 and 2.4.13 ask
 * for at least 2 CSS px and 3:1).
 */
export const focusRing = { inner: colors.card, outer: colors.ink, bandPx: 2 } as const;

/**
 * The least width and height of anything pressed: WCAG 2.2 SC 2.5.5 Target Size (Enhanced, AAA)
 * asks 44 × 44 CSS px, and Apple's Human Interface Guidelines 44 × 44 pt. tests/e2e/access.test.ts
 * measures every control on every screen at 390 px against it.
 */
export const TAP_TARGET_PX = 44;

export const space = { xs: 4, sm: 8, md: 12, lg: 16, xl: 24, xxl: 32 } as const;

export const radius = { card: 10, control: 6 } as const;

/** What every card and panel stands on (LOOK.md): card paper, a 1 px border, rounded corners. */
export const cardSurface: ViewStyle = {
  backgroundColor: colors.card,
  borderColor: colors.border,
  borderWidth: 1,
  borderRadius: radius.card,
};

/** Numbers that change live keep their width so digits do not jump. */
export const tabular: TextStyle = { fontVariant: ['tabular-nums'] };

export const type = {
  body: { fontFamily: fonts.regular, fontSize: 14, lineHeight: 20, color: colors.ink },
  small: { fontFamily: fonts.regular, fontSize: 12, lineHeight: 16, color: colors.iron },
  label: { fontFamily: fonts.medium, fontSize: 12, lineHeight: 16, color: colors.iron },
  title: { fontFamily: fonts.bold, fontSize: 18, lineHeight: 24, color: colors.ink },
  heading: { fontFamily: fonts.medium, fontSize: 16, lineHeight: 22, color: colors.ink },
  hero: { fontFamily: fonts.bold, fontSize: 40, lineHeight: 46, color: colors.ink },
} satisfies Record<string, TextStyle>;
