import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';

import { space } from '@/components/theme';

import { useBreakpoints } from './breakpoints';

interface ColumnsProps {
  /** The page's list: first on a phone, the left column on a wide screen. */
  first: ReactNode;
  /** What goes with it (a form, a side panel): after it on a phone, beside it when wide. */
  second: ReactNode;
}

/**
 * Phone first: one column, `first` then `second`. On a wide screen (BREAKPOINTS.wide) the two
 * stand side by side in equal columns, so a page uses the width instead of leaving empty sides.
 */
export function Columns({ first, second }: ColumnsProps) {
  const { isWide } = useBreakpoints();
  if (!isWide) {
    return (
      <>
        {first}
        {second}
      </>
    );
  }
  return (
    <View style={styles.columns}>
      <View style={styles.column}>{first}</View>
      <View style={styles.column}>{second}</View>
    </View>
  );
}

const styles = StyleSheet.create({
  columns: { flexDirection: 'row', alignItems: 'flex-start', gap: space.xl },
  column: { flex: 1, minWidth: 0, gap: space.lg },
});
