import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';

import { colors, space } from '@/components/theme';

interface ScreenProps {
  /** Sits above the scrolling area, full width (e.g. the shop header). */
  header?: ReactNode;
  children: ReactNode;
  testID?: string;
}

/** A page: paper background, safe-area padding, an optional fixed header and a scroll area. */
export function Screen({ header, children, testID }: ScreenProps) {
  const insets = useSafeAreaInsets();
  return (
    <View style={[styles.page, { paddingTop: insets.top }]} testID={testID}>
      {header}
      <ScrollView
        style={styles.scroll}
        contentContainerStyle={[styles.scrollContent, { paddingBottom: insets.bottom + space.xxl }]}
      >
        {children}
      </ScrollView>
    </View>
  );
}

const styles = StyleSheet.create({
  page: { flex: 1, backgroundColor: colors.paper },
  scroll: { flex: 1 },
  scrollContent: { flexGrow: 1, paddingTop: space.lg },
});
