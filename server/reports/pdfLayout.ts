/**
 * The PDF's sheet, type and colours. Sizes are PDF points (1/72 in). Colours are LOOK.md's roles
 * (the app keeps the same hex values in components/theme.ts, which the server may not import);
 * the page stays white instead of LOOK's paper colour because a printed background costs ink and
 * turns grey on a black-and-white printer.
 */
import { createRequire } from 'node:module';

import type { Level } from '@/ingest/wire/levels';
import type { PaperSize } from '@/ingest/wire/reports';

/**
 * ISO 216 A4 is 210 × 297 mm = 595.28 × 841.89 pt; ANSI letter is 8.5 × 11 in = 612 × 792 pt.
 * pdfkit's own 'A4' and 'LETTER' are the same numbers; they are written out so the sheet is
 * visible here and checked against the standards in the test.
 */
export const PAPER_POINTS: Record<PaperSize, { width: number; height: number }> = {
  a4: { width: 595.28, height: 841.89 },
  letter: { width: 612, height: 792 },
};

/** 15 mm on every side is inside any office printer's unprintable edge. */
export const MARGIN_PT = 42.52;

/** Room kept under the content for the footer line. */
export const FOOTER_PT = 20;

export const pdfColors = {
  ink: '#1F2427',
  iron: '#56626B',
  border: '#E2DCCF',
  card: '#FFFDF8',
  dew: '#7A5AA6',
  dry: '#2E7A57',
  close: '#8F6210',
  wet: '#A5402D',
  unknown: '#656C73',
} as const;

export const levelPdfColors: Record<Level, string> = {
  dry: pdfColors.dry,
  close: pdfColors.close,
  wet: pdfColors.wet,
  unknown: pdfColors.unknown,
};

export const typeSizes = { title: 16, heading: 11.5, body: 8.5, small: 7 } as const;

export const FONT_REGULAR = 'JetBrainsMono-Regular';
export const FONT_BOLD = 'JetBrainsMono-Bold';

// The font package's index.js loads expo-font (it only runs inside Expo): take the TTF files by
// path and never import the package itself on the server.
const requireFromHere = createRequire(import.meta.url);

/** The faces' file paths; pdfkit embeds the glyphs each document uses (a subset). */
export const FONT_FILES: Record<typeof FONT_REGULAR | typeof FONT_BOLD, string> = {
  [FONT_REGULAR]: requireFromHere.resolve(
    '@expo-google-fonts/jetbrains-mono/400Regular/JetBrainsMono_400Regular.ttf',
  ),
  [FONT_BOLD]: requireFromHere.resolve(
    '@expo-google-fonts/jetbrains-mono/700Bold/JetBrainsMono_700Bold.ttf',
  ),
};
