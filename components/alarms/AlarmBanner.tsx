import { Link } from 'expo-router';
import { useState, type ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { Button } from '@/components/forms';
import { shopSectionHref } from '@/components/hrefs';
import { Content } from '@/components/layout';
import { useAlarmsQuery, useUnitPref, type Alarm } from '@/components/queries';
import { colors, fonts, levelColors, space, TAP_TARGET_PX, type } from '@/components/theme';
import { useNow } from '@/components/ui';

import { AlarmAckForm } from './AlarmAckForm';
import { acknowledgementLine, alarmHeadline, ALARM_KIND_TONE, bannerAlarms } from './alarmText';

/** A phone has room for a few lines under the header; the Alarms page has the rest. */
const SHOWN = 3;

interface AlarmBannerProps {
  shopId: string;
  timeZone: string;
  /** Members and owners acknowledge; viewers only read. */
  canAcknowledge: boolean;
  maxWidth?: number;
}

/** The shop's open alarms, pinned under the header, in plain words; nothing when all is well. */
export function AlarmBanner({ shopId, timeZone, canAcknowledge, maxWidth }: AlarmBannerProps) {
  const alarms = useAlarmsQuery(shopId, 'open');
  const now = useNow();
  const unit = useUnitPref();
  const [acknowledging, setAcknowledging] = useState<string | null>(null);
  const open = bannerAlarms(alarms.data?.alarms ?? []);
  if (open.length === 0) return null;
  const edge = levelColors[ALARM_KIND_TONE[open[0]!.kind]];
  const more = open.length - SHOWN;

  return (
    <View role="alert" style={[styles.banner, { borderLeftColor: edge }]} testID="alarm-banner">
      <Content maxWidth={maxWidth} style={styles.inner}>
        {open.slice(0, SHOWN).map((alarm) => (
          <AlarmLine
            key={alarm.id}
            alarm={alarm}
            headline={alarmHeadline(alarm, now, timeZone, unit)}
            canAcknowledge={canAcknowledge}
            form={
              acknowledging === alarm.id ? (
                <AlarmAckForm
                  shopId={shopId}
                  alarmId={alarm.id}
                  onDone={() => setAcknowledging(null)}
                />
              ) : null
            }
            onAcknowledge={() => setAcknowledging(alarm.id)}
          />
        ))}
        <Link
          href={shopSectionHref(shopId, 'alarms')}
          style={styles.link}
          testID="alarm-banner-all"
        >
          {more > 0 ? `${more} more — all alarms →` : 'All alarms →'}
        </Link>
      </Content>
    </View>
  );
}

interface AlarmLineProps {
  alarm: Alarm;
  headline: string;
  canAcknowledge: boolean;
  form: ReactNode;
  onAcknowledge: () => void;
}

function AlarmLine({ alarm, headline, canAcknowledge, form, onAcknowledge }: AlarmLineProps) {
  const acknowledged = acknowledgementLine(alarm);
  return (
    <View style={styles.item} testID="alarm-banner-item">
      <View style={styles.row}>
        <View style={styles.text}>
          <View style={styles.headRow}>
            <View
              style={[styles.dot, { backgroundColor: levelColors[ALARM_KIND_TONE[alarm.kind]] }]}
            />
            <Text style={styles.headline} testID="alarm-headline">
              {headline}
            </Text>
          </View>
          {acknowledged ? (
            <Text style={[type.small, styles.indent]} testID="alarm-acknowledged">
              {acknowledged}
            </Text>
          ) : null}
        </View>
        {canAcknowledge && !acknowledged && !form ? (
          <Button
            label="Acknowledge"
            variant="quiet"
            onPress={onAcknowledge}
            testID="alarm-ack-open"
          />
        ) : null}
      </View>
      {form ? <View style={styles.indent}>{form}</View> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  banner: {
    backgroundColor: colors.card,
    borderBottomWidth: 1,
    borderBottomColor: colors.border,
    borderLeftWidth: 5,
    paddingVertical: space.sm,
  },
  inner: { gap: space.sm },
  item: { gap: space.xs },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  headRow: { flexDirection: 'row', alignItems: 'flex-start', gap: space.sm },
  dot: { width: 10, height: 10, borderRadius: 5, marginTop: 5 },
  text: { flex: 1, minWidth: 0, gap: 2 },
  indent: { paddingLeft: 10 + space.sm },
  headline: {
    flex: 1,
    fontFamily: fonts.medium,
    fontSize: 15,
    lineHeight: 20,
    color: colors.ink,
  },
  link: {
    ...type.small,
    minHeight: TAP_TARGET_PX,
    paddingVertical: (TAP_TARGET_PX - type.small.lineHeight) / 2,
    color: colors.air,
    textDecorationLine: 'underline',
    alignSelf: 'flex-start',
  },
});
