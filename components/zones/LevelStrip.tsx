import { Fragment } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { levelWordInline } from '@/ingest/words';
import { colors, fonts, levelColors, space, tabular, type } from '@/components/theme';

import type { LevelCount } from './zoneOrder';

/**
 * Zones per level above the overview: "2 wet · 1 close · 3 dry". Each count carries its level's
 * word beside its dot, so the colour is never the only sign.
 */
export function LevelStrip({ counts }: { counts: LevelCount[] }) {
  const words = counts.map(({ level, count }) => `${count} ${levelWordInline(level)}`).join(' · ');
  return (
    <View
      style={styles.strip}
      testID="zone-strip"
      role="status"
      accessibilityLabel={`Zones: ${words}`}
      aria-label={`Zones: ${words}`}
    >
      {counts.map(({ level, count }, i) => (
        <Fragment key={level}>
          {i > 0 ? <Text style={styles.separator}>·</Text> : null}
          <View style={styles.item}>
            <View style={[styles.dot, { backgroundColor: levelColors[level] }]} />
            <Text
              style={[styles.text, tabular, { color: levelColors[level] }]}
              testID={`zone-strip-${level}`}
            >
              {count} {levelWordInline(level)}
            </Text>
          </View>
        </Fragment>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  strip: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', rowGap: space.xs },
  item: { flexDirection: 'row', alignItems: 'center', gap: space.xs + 2 },
  separator: { ...type.body, color: colors.iron, marginHorizontal: space.sm },
  dot: { width: 8, height: 8, borderRadius: 4 },
  text: { fontFamily: fonts.bold, fontSize: 14, lineHeight: 20 },
});
