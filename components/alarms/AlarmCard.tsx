import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import type { TemperatureUnit } from '@/ingest/units';
import { ALARM_KIND_WORDS, formatMargin, formatPercent, formatVolts } from '@/ingest/words';
import { Button } from '@/components/forms';
import type { Alarm } from '@/components/queries';
import { cardSurface, colors, fonts, levelColors, space, type } from '@/components/theme';

import { AlarmAckForm } from './AlarmAckForm';
import { AlarmAdvice } from './AlarmAdvice';
import { acknowledgementLine, alarmHeadline, ALARM_KIND_TONE, formatAlarmTime } from './alarmText';

interface AlarmCardProps {
  shopId: string;
  alarm: Alarm;
  nowMs: number;
  timeZone: string;
  canAcknowledge: boolean;
  /** The person's temperature unit, for margins. */
  unit: TemperatureUnit;
  /** A card above already advises on this kind: start with the advice folded. */
  adviceFolded?: boolean;
}

/** The worst value an alarm saw, in the words of its kind. */
function worstOf(alarm: Alarm, unit: TemperatureUnit): string | null {
  switch (alarm.kind) {
    case 'dew_risk':
    case 'wet_surface':
      return alarm.worstMarginK === null
        ? null
        : `closest margin ${formatMargin(alarm.worstMarginK, unit)}`;
    case 'humid_air':
      return alarm.peakRhPct === null ? null : `highest ${formatPercent(alarm.peakRhPct)} RH`;
    case 'battery_low':
      return alarm.lowestBatteryV === null ? null : `lowest ${formatVolts(alarm.lowestBatteryV)}`;
    case 'sensor_silent':
      return null;
  }
}

/** One alarm: what, where, since when, how bad it got, who acknowledged it and what they did. */
export function AlarmCard({
  shopId,
  alarm,
  nowMs,
  timeZone,
  canAcknowledge,
  unit,
  adviceFolded = false,
}: AlarmCardProps) {
  const [acknowledging, setAcknowledging] = useState(false);
  const tone = levelColors[ALARM_KIND_TONE[alarm.kind]];
  const open = alarm.state === 'open';
  const when = (iso: string) => formatAlarmTime(iso, nowMs, timeZone);
  const times = [
    // A silent sensor's and humid air's headlines already say since when.
    open && (alarm.kind === 'sensor_silent' || alarm.kind === 'humid_air')
      ? null
      : `since ${when(alarm.sinceAt)}`,
    alarm.clearedAt ? `cleared ${when(alarm.clearedAt)}` : null,
    worstOf(alarm, unit),
  ].filter(Boolean);
  const acknowledged = acknowledgementLine(alarm);

  return (
    <View style={[styles.card, { borderLeftColor: tone }]} testID="alarm-card">
      <View style={styles.top}>
        <Text style={[styles.kind, { color: tone }]}>{ALARM_KIND_WORDS[alarm.kind]}</Text>
        <Text style={[type.label, open && styles.openWord]}>{open ? 'OPEN' : 'CLEARED'}</Text>
      </View>
      <Text style={type.heading} role="heading" aria-level={3} testID="alarm-headline">
        {alarmHeadline(alarm, nowMs, timeZone, unit)}
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
      {open ? <AlarmAdvice kind={alarm.kind} folded={adviceFolded} /> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  card: { ...cardSurface, borderLeftWidth: 5, padding: space.lg, gap: space.sm },
  top: { flexDirection: 'row', justifyContent: 'space-between', gap: space.md },
  kind: { fontFamily: fonts.bold, fontSize: 13, letterSpacing: 0.6, textTransform: 'uppercase' },
  openWord: { color: colors.ink },
  action: { flexDirection: 'row' },
});
