import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { AlarmAckForm } from './AlarmAckForm';
import {
  acknowledgementLine,
  alarmHeadline,
  ALARM_ADVICE,
  ALARM_KIND_TONE,
  ALARM_KIND_WORDS,
  APPLIANCE_CAUTION,
  formatAlarmTime,
  needsApplianceCaution,
} from './alarmText';
import { formatMargin, formatPercent } from './format';
import { Button } from './forms';
import type { Alarm } from './queries';
import { cardSurface, colors, fonts, levelColors, space, type } from './theme';

interface AlarmCardProps {
  shopId: string;
  alarm: Alarm;
  nowMs: number;
  timeZone: string;
  canAcknowledge: boolean;
}

/** The worst value an alarm saw, in the words of its kind. */
function worstOf(alarm: Alarm): string | null {
  switch (alarm.kind) {
    case 'dew_risk':
    case 'wet_surface':
      return alarm.worstMarginK === null
        ? null
        : `closest margin ${formatMargin(alarm.worstMarginK)}`;
    case 'humid_air':
      return alarm.peakRhPct === null ? null : `highest ${formatPercent(alarm.peakRhPct)} RH`;
    case 'battery_low':
      return alarm.lowestBatteryV === null ? null : `lowest ${alarm.lowestBatteryV.toFixed(2)} V`;
    case 'sensor_silent':
      return null;
  }
}

/** One alarm: what, where, since when, how bad it got, who acknowledged it and what they did. */
export function AlarmCard({ shopId, alarm, nowMs, timeZone, canAcknowledge }: AlarmCardProps) {
  const [acknowledging, setAcknowledging] = useState(false);
  const tone = levelColors[ALARM_KIND_TONE[alarm.kind]];
  const open = alarm.state === 'open';
  const when = (iso: string) => formatAlarmTime(iso, nowMs, timeZone);
  const times = [
    // A silent sensor's headline already says since when.
    open && alarm.kind === 'sensor_silent' ? null : `since ${when(alarm.sinceAt)}`,
    alarm.clearedAt ? `cleared ${when(alarm.clearedAt)}` : null,
    worstOf(alarm),
  ].filter(Boolean);
  const acknowledged = acknowledgementLine(alarm);

  return (
    <View style={[styles.card, { borderLeftColor: tone }]} testID="alarm-card">
      <View style={styles.top}>
        <Text style={[styles.kind, { color: tone }]}>{ALARM_KIND_WORDS[alarm.kind]}</Text>
        <Text style={[type.label, open && styles.openWord]}>{open ? 'OPEN' : 'CLEARED'}</Text>
      </View>
      <Text style={type.heading} testID="alarm-headline">
        {alarmHeadline(alarm, nowMs, timeZone)}
      </Text>
      <Text style={type.small}>{times.join(' · ')}</Text>
      {acknowledged ? (
        <Text style={type.body} testID="alarm-acknowledged">
          {acknowledged}
          <Text style={type.small}> at {when(alarm.acknowledgement!.at)}</Text>
        </Text>
      ) : acknowledging ? (
        <AlarmAckForm shopId={shopId} alarmId={alarm.id} onDone={() => setAcknowledging(false)} />
      ) : canAcknowledge ? (
        <View style={styles.action}>
          <Button
            label="Acknowledge"
            variant="quiet"
            onPress={() => setAcknowledging(true)}
            testID="alarm-ack-open"
          />
        </View>
      ) : (
        <Text style={type.small}>Not acknowledged yet.</Text>
      )}
      {open ? (
        <View style={styles.advice}>
          <Text style={type.body}>{ALARM_ADVICE[alarm.kind]}</Text>
          {needsApplianceCaution(alarm.kind) ? (
            <Text style={type.small} testID="alarm-caution">
              {APPLIANCE_CAUTION}
            </Text>
          ) : null}
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  card: { ...cardSurface, borderLeftWidth: 5, padding: space.lg, gap: space.sm },
  top: { flexDirection: 'row', justifyContent: 'space-between', gap: space.md },
  kind: { fontFamily: fonts.bold, fontSize: 13, letterSpacing: 0.6, textTransform: 'uppercase' },
  openWord: { color: colors.ink },
  action: { flexDirection: 'row' },
  advice: { gap: space.xs, borderTopWidth: 1, borderTopColor: colors.border, paddingTop: space.sm },
});
