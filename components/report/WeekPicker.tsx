import { StyleSheet, Text, View } from 'react-native';

import { Button } from '@/components/forms';
import { space, tabular, type } from '@/components/theme';

import { shiftWeek, weekLabel, weekSpanShort } from './reportWeek';

interface WeekPickerProps {
  /** The Monday shown, shop-local, YYYY-MM-DD. */
  start: string;
  /** No week after this one to go to (the current week). */
  latest: boolean;
  /** The figures stop at the report's making: the week is not over. */
  soFar: boolean;
  onChange: (start: string) => void;
}

/**
 * The week shown as its shop-local dates between a previous and a next button, each naming the
 * dates it goes to; next stops at the current week.
 */
export function WeekPicker({ start, latest, soFar, onChange }: WeekPickerProps) {
  const previous = shiftWeek(start, -1);
  const next = shiftWeek(start, 1);
  return (
    <View style={styles.box} testID="report-week-picker">
      <Text style={[type.title, tabular]} role="heading" aria-level={2} testID="report-week-label">
        {weekLabel(start)}
        {soFar ? (
          <Text style={type.small} testID="report-so-far">
            {' '}
            (so far)
          </Text>
        ) : null}
      </Text>
      <View style={styles.buttons}>
        <Button
          label={`← ${weekSpanShort(previous)}`}
          variant="quiet"
          // The name starts with the visible dates (the arrow is decoration), then says where they lead.
          accessibilityLabel={`${weekSpanShort(previous)}, the week before: ${weekLabel(previous)}`}
          onPress={() => onChange(previous)}
          testID="report-week-previous"
        />
        <Button
          label={`${weekSpanShort(next)} →`}
          variant="quiet"
          accessibilityLabel={
            latest
              ? `${weekSpanShort(next)}, the week after: not begun`
              : `${weekSpanShort(next)}, the week after: ${weekLabel(next)}`
          }
          disabled={latest}
          onPress={() => onChange(next)}
          testID="report-week-next"
        />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm },
  buttons: { flexDirection: 'row', justifyContent: 'space-between', gap: space.sm },
});
