import { StyleSheet, Text, View } from 'react-native';

import type { Level } from '@/ingest';
import { fonts, levelColors, levelWords, space } from '@/components/theme';

interface LevelMarkProps {
  level: Level;
  testID?: string;
}

/** A level as its word in its colour, with a dot; the word carries the meaning. */
export function LevelMark({ level, testID }: LevelMarkProps) {
  const color = levelColors[level];
  return (
    <View
      style={styles.row}
      testID={testID}
      accessibilityLabel={`Level: ${levelWords[level]}`}
      aria-label={`Level: ${levelWords[level]}`}
    >
      <View style={[styles.dot, { backgroundColor: color }]} />
      <Text style={[styles.word, { color }]}>{levelWords[level]}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'center', gap: space.xs + 2 },
  dot: { width: 8, height: 8, borderRadius: 4 },
  word: { fontFamily: fonts.bold, fontSize: 13, letterSpacing: 0.6 },
});
