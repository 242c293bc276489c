import type { ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { cardSurface, space, type } from '@/components/theme';

interface PanelProps {
  title?: string;
  /** A line under the title saying what the panel is for. */
  hint?: string;
  children?: ReactNode;
  testID?: string;
}

/** A card with an optional heading: the unit pages are built from. */
export function Panel({ title, hint, children, testID }: PanelProps) {
  return (
    <View style={styles.panel} testID={testID}>
      {title ? (
        <Text style={type.heading} role="heading" aria-level={2}>
          {title}
        </Text>
      ) : null}
      {hint ? <Text style={type.small}>{hint}</Text> : null}
      {children}
    </View>
  );
}

const styles = StyleSheet.create({
  panel: { ...cardSurface, padding: space.lg, gap: space.md },
});
