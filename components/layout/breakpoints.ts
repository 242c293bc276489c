/**
 * One source for responsive layout. Phone first: the wide layout adds a column beside the
 * list, never features of its own.
 */
import { useWindowDimensions } from 'react-native';

/** Widths in CSS pixels where the layout changes. */
export const BREAKPOINTS = {
  /** A tablet in portrait or a narrow window: roomier padding, still one column. */
  medium: 640,
  /** Two columns: the zone list beside the selected zone. */
  wide: 1024,
} as const;

/** A readable column: cards and forms never stretch past this on a wide screen. */
export const CONTENT_MAX_WIDTH = 1200;
/** One column below the wide breakpoint: a tablet gets a phone's column, centred. */
export const SINGLE_COLUMN_MAX_WIDTH = 640;
export const FORM_MAX_WIDTH = 420;
export const LIST_COLUMN_WIDTH = 400;

export interface Breakpoints {
  width: number;
  isMedium: boolean;
  isWide: boolean;
  /** Horizontal page padding for this width. */
  gutter: number;
}

export function getBreakpoints(width: number): Breakpoints {
  const isWide = width >= BREAKPOINTS.wide;
  const isMedium = width >= BREAKPOINTS.medium;
  return { width, isMedium, isWide, gutter: isWide ? 32 : isMedium ? 24 : 16 };
}

export function useBreakpoints(): Breakpoints {
  const { width } = useWindowDimensions();
  return getBreakpoints(width);
}
