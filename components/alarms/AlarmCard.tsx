import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import type { TemperatureUnit } from '@/ingest/units';
import {
  ALARM_KIND_WORDS,
  alarmLevelWord,
  formatMargin,
  formatPercent,
  formatVolts,
} from '@/ingest/words';
import { Button } from '@/components/forms';
import type { Alarm, Zone } from '@/components/queries';
import { cardSurface, colors, fonts, levelColors, space, type } from '@/components/theme';

import { AlarmAckForm } from './AlarmAckForm';
import { AlarmAdvice } from './AlarmAdvice';
import {
  acknowledgementLine,
  alarmHeadline,
  ALARM_KIND_TONE,
  formatAlarmTime,
  nowAndWorst,
  ruleOf,
} from './alarmText';

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
  /** The alarm's zone (limits and newest reading): what it reads now and the rule's numbers. */
  zone?: Zone;
  /** Scrolled to and marked: the alarm a notification opened. */
  focused?: boolean;
}

/** The worst value a cleared alarm saw, in the words of its kind. */
function worstOf(alarm: Alarm, unit: TemperatureUnit): string | null {
  switch (alarm.kind) {
    case 'dew_risk':
    case 'wet_surface':
      return alarm.worstMarginK === null
        ? null
        : `worst margin ${formatMargin(alarm.worstMarginK, unit)}`;
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
  zone,
  focused = false,
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
    open ? null : worstOf(alarm, unit),
  ].filter(Boolean);
  const acknowledged = acknowledgementLine(alarm);
  const levelWord = alarmLevelWord(alarm.kind);
  const values = open ? nowAndWorst(alarm, zone, unit) : null;
  const rule = ruleOf(alarm, zone, unit);

  return (
    <View
      style={[styles.card, { borderLeftColor: tone }, focused && styles.focused]}
      testID="alarm-card"
      nativeID={`alarm-${alarm.id}`}
      aria-current={focused ? 'true' : undefined}
    >
      <View style={styles.top}>
        <Text style={[styles.kind, { color: tone }]}>
          {levelWord ? `${levelWord} · ` : ''}
          {ALARM_KIND_WORDS[alarm.kind]}
        </Text>
        <Text style={[type.label, open && styles.openWord]}>{open ? 'Open' : 'Cleared'}</Text>
      </View>
      <Text style={type.heading} role="heading" aria-level={3} testID="alarm-headline">
        {alarmHeadline(alarm, nowMs, timeZone, unit, zone)}
      </Text>
      {values ? (
        <Text style={[type.body, styles.values]} testID="alarm-now">
          {values}
        </Text>
      ) : null}
      <Text style={type.small}>{times.join(' · ')}</Text>
      {rule ? (
        <Text style={type.small} testID="alarm-rule">
          {open ? `${rule.clears} ${rule.opens}` : `${rule.opens} ${rule.clears}`}
        </Text>
      ) : null}
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
  kind: { fontFamily: fonts.bold, fontSize: 14 },
  openWord: { color: colors.ink },
  values: { fontVariant: ['tabular-nums'] },
  focused: { borderColor: colors.ink, borderWidth: 2, borderLeftWidth: 5 },
  action: { flexDirection: 'row' },
});
