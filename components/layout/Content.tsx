import type { ReactNode } from 'react';
import { StyleSheet, View, type StyleProp, type ViewStyle } from 'react-native';

import { CONTENT_MAX_WIDTH, useBreakpoints } from './breakpoints';

interface ContentProps {
  children: ReactNode;
  /** Caps the column; defaults to the page's readable width. */
  maxWidth?: number;
  style?: StyleProp<ViewStyle>;
}

/** Centres a readable column with the page gutter for the current width. */
export function Content({ children, maxWidth = CONTENT_MAX_WIDTH, style }: ContentProps) {
  const { gutter } = useBreakpoints();
  return (
    <View style={[styles.content, { maxWidth, paddingHorizontal: gutter }, style]}>{children}</View>
  );
}

const styles = StyleSheet.create({
  content: { width: '100%', alignSelf: 'center' },
});
