import { StyleSheet, Text, View } from 'react-native';

import { space, tabular, type } from '@/components/theme';

export interface Figure {
  key: string;
  label: string;
  value: string;
}

interface FigureListProps {
  figures: Figure[];
  /** Two columns of figures where there is room (a wide panel); one on a phone. */
  columns?: 1 | 2;
  testID?: string;
}

/** Label above value, as a description list would read: every number has its name beside it. */
export function FigureList({ figures, columns = 1, testID }: FigureListProps) {
  return (
    <View style={[styles.list, columns === 2 && styles.two]} testID={testID}>
      {figures.map((figure) => (
        <View
          key={figure.key}
          style={[styles.item, columns === 2 && styles.half]}
          testID={testID ? `${testID}-${figure.key}` : undefined}
        >
          <Text style={type.label}>{figure.label}</Text>
          <Text style={[type.body, tabular]}>{figure.value}</Text>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  two: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.lg },
  item: { gap: 2 },
  half: { flexBasis: '45%', flexGrow: 1 },
});
