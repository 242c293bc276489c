import { Link } from 'expo-router';
import { useState, type ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { alarmsSummaryLine } from '@/ingest/words';
import { Button } from '@/components/forms';
import { shopSectionHref } from '@/components/hrefs';
import { Content, useBreakpoints } from '@/components/layout';
import {
  useAlarmsQuery,
  useUnitPref,
  useZonesQuery,
  type Alarm,
  type Zone,
} from '@/components/queries';
import { colors, fonts, levelColors, space, TAP_TARGET_PX, type } from '@/components/theme';
import { useNow } from '@/components/ui';

import { AlarmAckForm } from './AlarmAckForm';
import {
  acknowledgementLine,
  alarmFacts,
  alarmHeadline,
  ALARM_KIND_TONE,
  bannerAlarms,
  bySeverity,
  nowAndWorst,
  ruleOf,
  zonesById,
} from './alarmText';

/** A wide screen shows the worst few; the Alarms page has the rest. */
const SHOWN = 3;

interface AlarmBannerProps {
  shopId: string;
  timeZone: string;
  /** Members and owners acknowledge; viewers only read. */
  canAcknowledge: boolean;
  maxWidth?: number;
}

/**
 * The shop's open alarms, pinned under the header, in plain words; nothing when all is well. On
 * a phone it is one line ("2 alarms — Machine room wet", the worst first) that opens the Alarms
 * page, so header, banner and tab bar leave the screen to the zones; a wide screen has room for
 * the worst few with what they read now and what clears them.
 */
export function AlarmBanner({ shopId, timeZone, canAcknowledge, maxWidth }: AlarmBannerProps) {
  const alarms = useAlarmsQuery(shopId, 'open');
  const zones = zonesById(useZonesQuery(shopId).data?.zones);
  const now = useNow();
  const unit = useUnitPref();
  const { isWide } = useBreakpoints();
  const [acknowledging, setAcknowledging] = useState<string | null>(null);
  const open = bannerAlarms(alarms.data?.alarms ?? []);
  if (open.length === 0) return null;
  const edge = levelColors[ALARM_KIND_TONE[open[0]!.kind]];
  const href = shopSectionHref(shopId, 'alarms');

  if (!isWide) {
    // Every open alarm counts, the dew-risk warnings a wet alarm hides included; worst first.
    const all = [...(alarms.data?.alarms ?? [])].sort(bySeverity);
    const line = alarmsSummaryLine(all.map((a) => alarmFacts(a)));
    return (
      <View
        role="alert"
        style={[styles.banner, styles.phoneBanner, { borderLeftColor: edge }]}
        testID="alarm-banner"
      >
        <Content maxWidth={maxWidth}>
          <Link href={href} style={styles.phoneLink} testID="alarm-banner-all">
            <View style={styles.headRow}>
              <View style={[styles.dot, { backgroundColor: edge }]} />
              <Text style={styles.phoneLine} numberOfLines={1} testID="alarm-banner-line">
                {line}
              </Text>
              <Text style={styles.more} aria-hidden>
                ›
              </Text>
            </View>
          </Link>
        </Content>
      </View>
    );
  }

  const more = open.length - SHOWN;
  return (
    <View role="alert" style={[styles.banner, { borderLeftColor: edge }]} testID="alarm-banner">
      <Content maxWidth={maxWidth} style={styles.inner}>
        {open.slice(0, SHOWN).map((alarm) => {
          const zone = zones.get(alarm.zone.id);
          return (
            <AlarmLine
              key={alarm.id}
              alarm={alarm}
              zone={zone}
              headline={alarmHeadline(alarm, now, timeZone, unit, zone)}
              detail={[nowAndWorst(alarm, zone, unit), ruleOf(alarm, zone, unit)?.clearsShort]
                .filter(Boolean)
                .join(' · ')}
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
          );
        })}
        <Link href={href} style={styles.link} testID="alarm-banner-all">
          {more > 0 ? `${more} more — all alarms →` : 'All alarms →'}
        </Link>
      </Content>
    </View>
  );
}

interface AlarmLineProps {
  alarm: Alarm;
  zone: Zone | undefined;
  headline: string;
  detail: string;
  canAcknowledge: boolean;
  form: ReactNode;
  onAcknowledge: () => void;
}

function AlarmLine({
  alarm,
  headline,
  detail,
  canAcknowledge,
  form,
  onAcknowledge,
}: AlarmLineProps) {
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
          {detail ? (
            <Text style={[type.small, styles.indent]} testID="alarm-banner-detail">
              {detail}
            </Text>
          ) : null}
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
  headRow: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  dot: { width: 10, height: 10, borderRadius: 5, flexShrink: 0 },
  text: { flex: 1, minWidth: 0, gap: 2 },
  indent: { paddingLeft: 10 + space.sm },
  headline: {
    flex: 1,
    fontFamily: fonts.medium,
    fontSize: 15,
    lineHeight: 20,
    color: colors.ink,
  },
  phoneBanner: { paddingVertical: 2 },
  // A 44 px target (WCAG 2.5.5) inside a banner of one line.
  phoneLink: { display: 'flex', minHeight: 44, justifyContent: 'center' },
  phoneLine: {
    flex: 1,
    minWidth: 0,
    fontFamily: fonts.medium,
    fontSize: 15,
    lineHeight: 20,
    color: colors.ink,
  },
  more: { fontFamily: fonts.bold, fontSize: 18, lineHeight: 20, color: colors.iron },
  link: {
    ...type.small,
    minHeight: TAP_TARGET_PX,
    paddingVertical: (TAP_TARGET_PX - type.small.lineHeight) / 2,
    color: colors.air,
    textDecorationLine: 'underline',
    alignSelf: 'flex-start',
  },
});
