import type { ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { cardSurface, space, type } from '@/components/theme';

interface NoticeProps {
  title: string;
  /** Makes the title a heading of this level: 1 where the notice is all the screen shows. */
  level?: 1 | 2 | 3;
  children?: ReactNode;
  testID?: string;
}

/** A plain panel for empty, loading and error states. */
export function Notice({ title, level, children, testID }: NoticeProps) {
  return (
    <View style={styles.panel} testID={testID}>
      {level ? (
        <Text style={type.heading} role="heading" aria-level={level}>
          {title}
        </Text>
      ) : (
        <Text style={type.heading}>{title}</Text>
      )}
      {typeof children === 'string' ? <Text style={type.body}>{children}</Text> : children}
    </View>
  );
}

const styles = StyleSheet.create({
  panel: { ...cardSurface, padding: space.lg, gap: space.sm },
});
