import type { ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { cardSurface, space, type } from '@/components/theme';

interface NoticeProps {
  title: string;
  children?: ReactNode;
  testID?: string;
}

/** A plain panel for empty, loading and error states. */
export function Notice({ title, children, testID }: NoticeProps) {
  return (
    <View style={styles.panel} testID={testID}>
      <Text style={type.heading}>{title}</Text>
      {typeof children === 'string' ? <Text style={type.body}>{children}</Text> : children}
    </View>
  );
}

const styles = StyleSheet.create({
  panel: { ...cardSurface, padding: space.lg, gap: space.sm },
});
