import { StyleSheet, Text, View } from 'react-native';

import { space, tabular, type } from '@/components/theme';

import type { Figure } from './reportFigures';

interface FigureListProps {
  /** Rows of figures; the figures of a row sit side by side (min, mean, max). */
  rows: Figure[][];
  testID?: string;
}

/** Label above value, as a description list reads: every number has its name beside it. */
export function FigureList({ rows, testID }: FigureListProps) {
  return (
    <View style={styles.list} testID={testID}>
      {rows.map((row) => (
        <View key={row.map((figure) => figure.key).join()} style={styles.row}>
          {row.map((figure) => (
            <View
              key={figure.key}
              style={styles.item}
              testID={testID ? `${testID}-${figure.key}` : undefined}
            >
              <Text style={type.label}>{figure.label}</Text>
              <Text style={[type.body, tabular]}>{figure.value}</Text>
            </View>
          ))}
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  row: { flexDirection: 'row', columnGap: space.md },
  // Values of a row line up though one label wraps to two lines.
  item: { flex: 1, minWidth: 0, gap: 2, justifyContent: 'space-between' },
});
