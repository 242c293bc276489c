import { useEffect } from 'react';
import { Platform, StyleSheet, Text, View } from 'react-native';

import { useBreakpoints } from '@/components/layout';
import {
  useAlarmsQuery,
  useUnitPref,
  useZonesQuery,
  type Alarm,
  type ShopSummary,
} from '@/components/queries';
import { useFrameShop } from '@/components/shop/ShopFrame';
import { space, type } from '@/components/theme';
import { Notice, useDocumentTitle, useNow } from '@/components/ui';

import { AlarmCard } from './AlarmCard';
import { bySeverity, zonesById } from './alarmText';

/**
 * A shop's alarms: the open ones with what to do, and the recent ones with who acknowledged
 * them and what they did. Phone: one column; wide: open and recent side by side. `focusAlarmId`
 * (from a notification) is scrolled into view and marked.
 */
export function AlarmsScreen({ focusAlarmId }: { focusAlarmId?: string }) {
  const shop = useFrameShop();
  const { isWide } = useBreakpoints();
  useDocumentTitle('Alarms', shop.name);
  return <AlarmLists shop={shop} wide={isWide} focusAlarmId={focusAlarmId} />;
}

function AlarmLists({
  shop,
  wide,
  focusAlarmId,
}: {
  shop: ShopSummary;
  wide: boolean;
  focusAlarmId?: string;
}) {
  const alarms = useAlarmsQuery(shop.id, 'all');
  const zones = zonesById(useZonesQuery(shop.id).data?.zones);
  const nowMs = useNow();
  const unit = useUnitPref();
  const loaded = alarms.data !== undefined;
  useEffect(() => {
    if (!focusAlarmId || !loaded || Platform.OS !== 'web') return;
    document
      .getElementById(`alarm-${focusAlarmId}`)
      ?.scrollIntoView({ block: 'center', behavior: 'instant' });
  }, [focusAlarmId, loaded]);
  if (alarms.isError) {
    return (
      <Notice title="Alarms could not be loaded" testID="alarms-error">
        {alarms.error.message}
      </Notice>
    );
  }
  if (!alarms.data) return <Notice title="Loading alarms…" />;

  const section = (title: string, items: Alarm[], empty: string, testID: string) => (
    <View style={[styles.section, wide && styles.wideSection]} testID={testID}>
      <Text style={type.title} role="heading" aria-level={2}>
        {title} <Text style={type.small}>({items.length})</Text>
      </Text>
      {items.length === 0 ? <Notice title={empty} /> : null}
      {items.map((alarm) => (
        <AlarmCard
          key={alarm.id}
          shopId={shop.id}
          alarm={alarm}
          nowMs={nowMs}
          timeZone={shop.timeZone}
          canAcknowledge={shop.role !== 'viewer'}
          unit={unit}
          adviceFolded={folded.has(alarm.id)}
          zone={zones.get(alarm.zone.id)}
          focused={alarm.id === focusAlarmId}
        />
      ))}
    </View>
  );
  const list = alarms.data.alarms;
  const open = list.filter((a) => a.state === 'open').sort(bySeverity);
  // The first open card of each kind spells out what to do and its safety cautions; later ones
  // of that kind start folded, so a phone is not scrolled through the same block again and again.
  const folded = new Set(
    open.filter((a, i) => open.findIndex((b) => b.kind === a.kind) !== i).map((a) => a.id),
  );
  return (
    <View style={[styles.sections, wide && styles.columns]}>
      {section('Open', open, 'No open alarms: every surface is clear.', 'alarms-open')}
      {section(
        'Recent',
        list.filter((a) => a.state === 'cleared'),
        'Nothing has cleared yet.',
        'alarms-recent',
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  sections: { gap: space.xl },
  columns: { flexDirection: 'row', alignItems: 'flex-start' },
  section: { gap: space.md },
  wideSection: { flex: 1, minWidth: 0 },
});
