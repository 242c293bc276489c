import { StyleSheet, Text, View } from 'react-native';

import { useWeekReadingsQuery, type ZoneWeekFigures } from '@/components/queries';
import { colors, type } from '@/components/theme';
import { LazyMarginChart } from '@/components/zones/LazyCharts';
import type { TemperatureUnit } from '@/ingest/units';
import { formatMargin, formatReportMoment } from '@/ingest/words';

interface ZoneWeekChartProps {
  shopId: string;
  zone: ZoneWeekFigures;
  /** The zone's limits (its settings), for the chart's close and wet bands. */
  limits: { wetK: number; cautionK: number };
  week: { from: string; to: string; periodEnd: string };
  timeZone: string;
  unit: TemperatureUnit;
  height: number;
}

/**
 * The zone's week as the overview draws a day: air, surface and dew point with the bands, from
 * the readings route over the report's own instants (to the report's end in the current week).
 */
export function ZoneWeekChart({
  shopId,
  zone,
  limits,
  week,
  timeZone,
  unit,
  height,
}: ZoneWeekChartProps) {
  const readings = useWeekReadingsQuery(shopId, zone.zoneId, week.from, week.periodEnd);
  const summary = zone.lowestMargin
    ? `${zone.name}, the week: lowest dew margin ${formatMargin(zone.lowestMargin.marginK, unit)} on ${formatReportMoment(zone.lowestMargin.at, timeZone)}`
    : `${zone.name}, the week: no dew margin measured or estimated`;
  if (readings.isError) {
    return (
      <Text style={[type.body, styles.error]} testID="report-chart-error">
        The chart could not be loaded: {readings.error.message}
      </Text>
    );
  }
  if (!readings.data) {
    return (
      <View style={[styles.placeholder, { height }]}>
        <Text style={type.small}>Loading the chart…</Text>
      </View>
    );
  }
  // The chart's own empty text speaks of the last 24 hours; a past week says it for itself.
  if (readings.data.points.length === 0) {
    return (
      <View style={[styles.placeholder, { height }]} testID="report-chart-empty">
        <Text style={type.small}>No readings to chart this week.</Text>
      </View>
    );
  }
  return (
    <LazyMarginChart
      points={readings.data.points}
      fromMs={Date.parse(week.from)}
      toMs={Date.parse(week.to)}
      bucketSeconds={readings.data.bucketSeconds}
      wetK={limits.wetK}
      cautionK={limits.cautionK}
      timeZone={timeZone}
      summary={summary}
      height={height}
      emptyText="No readings to chart this week."
      // The week's figures table gives the exact values; this small chart has no readout.
      activeIndex={null}
      onPointAt={() => undefined}
    />
  );
}

const styles = StyleSheet.create({
  placeholder: { alignItems: 'center', justifyContent: 'center' },
  error: { color: colors.wet },
});
