import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import type { AlarmKind } from '@/ingest/alarmKinds';
import { ALARM_ADVICE } from '@/ingest/words';
import { Button } from '@/components/forms';
import { colors, fonts, radius, space, type } from '@/components/theme';

/**
 * What to do about an open alarm, as a short numbered list, and the cautions that go with it in
 * a box headed "Safety" — set apart by its border and its heading, not by colour alone. The words
 * are ingest/words', the same the alarm e-mails carry.
 *
 * `folded` (a later card of a kind already advised above it) starts with one button instead, so a
 * phone's list of several wet zones is not the same six cautions over and over; the steps and
 * their cautions always unfold together.
 */
export function AlarmAdvice({ kind, folded = false }: { kind: AlarmKind; folded?: boolean }) {
  const [shown, setShown] = useState(!folded);
  const { steps, cautions } = ALARM_ADVICE[kind];
  if (!shown) {
    return (
      <View style={[styles.advice, styles.folded]} testID="alarm-advice">
        <Button
          label="What to do, and safety"
          variant="quiet"
          onPress={() => setShown(true)}
          testID="alarm-advice-open"
        />
      </View>
    );
  }
  return (
    <View style={styles.advice} testID="alarm-advice">
      <Text style={type.label}>What to do</Text>
      {steps.map((step, i) => (
        <View key={step} style={styles.item}>
          <Text style={[type.body, styles.marker]}>{i + 1}.</Text>
          <Text style={[type.body, styles.itemText]} testID="alarm-step">
            {step}
          </Text>
        </View>
      ))}
      {cautions.length > 0 ? (
        <View style={styles.safety} testID="alarm-safety" role="note" aria-label="Safety">
          <Text style={styles.safetyTitle}>Safety</Text>
          {cautions.map((caution) => (
            <View key={caution} style={styles.item}>
              <Text style={[styles.cautionText, styles.dash]}>–</Text>
              <Text style={[styles.cautionText, styles.itemText]} testID="alarm-caution">
                {caution}
              </Text>
            </View>
          ))}
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  advice: { gap: space.xs, borderTopWidth: 1, borderTopColor: colors.border, paddingTop: space.sm },
  folded: { flexDirection: 'row' },
  item: { flexDirection: 'row', gap: space.xs },
  marker: { width: 22, flexShrink: 0 },
  dash: { width: 14, flexShrink: 0 },
  itemText: { flex: 1, minWidth: 0 },
  safety: {
    marginTop: space.xs,
    gap: space.xs,
    backgroundColor: colors.paper,
    borderWidth: 1,
    borderLeftWidth: 4,
    borderColor: colors.iron,
    borderRadius: radius.control,
    paddingVertical: space.sm,
    paddingHorizontal: space.md,
  },
  safetyTitle: {
    fontFamily: fonts.bold,
    fontSize: 13,
    lineHeight: 18,
    letterSpacing: 0.6,
    textTransform: 'uppercase',
    color: colors.ink,
  },
  cautionText: { fontFamily: fonts.regular, fontSize: 13, lineHeight: 18, color: colors.ink },
});
