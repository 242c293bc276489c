import { StyleSheet, Text, View } from 'react-native';

import { DAY_WINDOW, useReadingsQuery, type Zone } from '@/components/queries';
import { colors, type } from '@/components/theme';
import { Panel } from '@/components/ui';

import { MarginChart } from './MarginChart';

interface ZoneHistoryProps {
  shopId: string;
  zone: Zone;
  timeZone: string;
  chartHeight?: number;
}

/**
 * The last 24 hours of a zone as a chart, in a panel. The heading is its own row rather than the
 * panel's title, to leave room for "updating…" beside it.
 */
export function ZoneHistory({ shopId, zone, timeZone, chartHeight }: ZoneHistoryProps) {
  const readings = useReadingsQuery(shopId, zone.id, DAY_WINDOW);
  const data = readings.data;
  return (
    <Panel>
      <View style={styles.head}>
        <Text style={type.heading} role="heading" aria-level={3}>
          Last 24 hours
        </Text>
        {readings.isFetching ? <Text style={type.small}>updating…</Text> : null}
      </View>
      {data ? (
        <MarginChart
          points={data.points}
          fromMs={Date.parse(data.from)}
          toMs={Date.parse(data.to)}
          bucketSeconds={data.bucketSeconds}
          wetK={zone.wetK}
          cautionK={zone.cautionK}
          timeZone={timeZone}
          height={chartHeight}
        />
      ) : readings.isError ? (
        <Text style={[type.body, styles.error]} testID="zone-chart-error">
          {readings.error.message}
        </Text>
      ) : (
        <View style={[styles.placeholder, { height: chartHeight ?? 260 }]}>
          <Text style={type.small}>Loading readings…</Text>
        </View>
      )}
    </Panel>
  );
}

const styles = StyleSheet.create({
  head: { flexDirection: 'row', alignItems: 'baseline', justifyContent: 'space-between' },
  placeholder: { alignItems: 'center', justifyContent: 'center' },
  error: { color: colors.wet },
});
