import { StyleSheet, Text, View } from 'react-native';

import type { LevelHours } from '@/components/queries';
import { colors, levelColors, levelWords, space, tabular, type } from '@/components/theme';
import { LEVELS } from '@/ingest/wire/levels';
import { formatHours } from '@/ingest/words';

interface LevelHoursBarProps {
  hours: LevelHours;
  testID?: string;
}

/**
 * The week's hours in each level as one stacked bar, with every number written under it: the
 * bar shows the shares at a glance, the words carry them (never colour alone), so the bar itself
 * is hidden from screen readers.
 */
export function LevelHoursBar({ hours, testID }: LevelHoursBarProps) {
  const total = LEVELS.reduce((sum, level) => sum + hours[level], 0);
  return (
    <View style={styles.box} testID={testID}>
      <View style={styles.bar} aria-hidden accessibilityElementsHidden>
        {total > 0
          ? LEVELS.filter((level) => hours[level] > 0).map((level) => (
              <View
                key={level}
                style={{
                  flexGrow: hours[level],
                  flexBasis: 0,
                  backgroundColor: levelColors[level],
                }}
              />
            ))
          : null}
      </View>
      <View style={styles.legend}>
        {LEVELS.map((level) => (
          <View key={level} style={styles.item} testID={testID ? `${testID}-${level}` : undefined}>
            <View style={[styles.dot, { backgroundColor: levelColors[level] }]} />
            <Text style={[type.small, tabular, styles.text]}>
              {levelWords[level]} {formatHours(hours[level])}
            </Text>
          </View>
        ))}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.xs + 2 },
  bar: {
    flexDirection: 'row',
    height: 10,
    borderRadius: 5,
    overflow: 'hidden',
    backgroundColor: colors.border,
  },
  legend: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.md, rowGap: 2 },
  item: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
  dot: { width: 8, height: 8, borderRadius: 2 },
  text: { color: colors.ink },
});
