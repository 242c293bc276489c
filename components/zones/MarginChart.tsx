import { useMemo, useState } from 'react';
import { StyleSheet, Text, View, type LayoutChangeEvent } from 'react-native';
import { VictoryArea, VictoryAxis, VictoryChart, VictoryContainer, VictoryLine } from 'victory';

import { useUnitPref, type ReadingPoint } from '@/components/queries';
import { dewPointSeriesLabel } from '@/ingest/words';
import { colors, fonts, space, type } from '@/components/theme';

import { hourTickLabel, hourTicks } from './chartTicks';
import { chartSeries, seriesInUnit } from './chartSeries';

interface MarginChartProps {
  points: ReadingPoint[];
  fromMs: number;
  toMs: number;
  bucketSeconds: number;
  wetK: number;
  cautionK: number;
  timeZone: string;
  height?: number;
}

const PADDING = { top: 12, bottom: 32, left: 44, right: 12 };
const AXIS_TEXT = { fontFamily: fonts.regular, fontSize: 11, fill: colors.iron };

/**
 * Air, surface and dew point (frost point below 0.01 °C) over time. The band above the dew point shows how close the
 * surface may come: the wet band up to the wet limit, the close band up to the caution limit.
 */
export function MarginChart({
  points,
  fromMs,
  toMs,
  bucketSeconds,
  wetK,
  cautionK,
  timeZone,
  height = 260,
}: MarginChartProps) {
  const [width, setWidth] = useState(0);
  const unit = useUnitPref();
  // Buckets carry how many readings they stand for; raw points count one each.
  const readingCount = points.reduce((n, p) => n + p.count, 0);
  // Below 0.01 °C the line is a frost point (ingest/psychrometrics.ts); the key says which.
  const dewWords = useMemo(() => dewPointSeriesLabel(points.map((p) => p.dewPoint)), [points]);
  const series = useMemo(
    () => seriesInUnit(chartSeries(points, { wetK, cautionK }, bucketSeconds), unit),
    [points, wetK, cautionK, bucketSeconds, unit],
  );
  // Roughly one label per 70 px keeps "HH:mm" labels apart on a phone.
  const stepHours = width >= 900 ? 2 : width >= 560 ? 3 : 6;
  const ticks = useMemo(
    () => hourTicks(fromMs, toMs, timeZone, stepHours),
    [fromMs, toMs, timeZone, stepHours],
  );

  const onLayout = (event: LayoutChangeEvent) => {
    const next = Math.round(event.nativeEvent.layout.width);
    if (next !== width) setWidth(next);
  };

  return (
    <View testID="zone-chart" style={styles.box}>
      <Legend dewWords={dewWords} />
      <View
        onLayout={onLayout}
        style={{ height }}
        accessibilityLabel={`Air, surface and ${dewWords} over the last 24 hours`}
        aria-label={`Air, surface and ${dewWords} over the last 24 hours`}
      >
        {width > 0 && series.hasData ? (
          <VictoryChart
            width={width}
            height={height}
            padding={PADDING}
            scale={{ x: 'time', y: 'linear' }}
            domain={{ x: [new Date(fromMs), new Date(toMs)], y: series.yDomain }}
            containerComponent={
              <VictoryContainer
                responsive={false}
                title={`Air, surface and ${dewWords}`}
                desc={`Last 24 hours, times in ${timeZone}`}
              />
            }
          >
            <VictoryAxis
              dependentAxis
              offsetX={PADDING.left}
              // Not a crossing axis, so Victory keeps the 0° tick it would otherwise hide.
              crossAxis={false}
              tickFormat={(t: number) => `${t}°${unit}`}
              style={{
                axis: { stroke: 'transparent' },
                grid: { stroke: colors.border, strokeWidth: 1 },
                ticks: { stroke: 'transparent' },
                tickLabels: { ...AXIS_TEXT, padding: 6 },
              }}
            />
            <VictoryAxis
              // Pinned to the bottom edge; by default it would cross the y axis at 0 °C.
              offsetY={PADDING.bottom}
              crossAxis={false}
              tickValues={ticks}
              tickFormat={(t: number | Date) => hourTickLabel(Number(t), timeZone)}
              style={{
                axis: { stroke: colors.border },
                ticks: { stroke: colors.border, size: 4 },
                tickLabels: { ...AXIS_TEXT, padding: 4 },
                grid: { stroke: 'transparent' },
              }}
            />
            <VictoryArea
              data={series.closeBand}
              style={{ data: { fill: colors.close, fillOpacity: 0.14, stroke: 'none' } }}
            />
            <VictoryArea
              data={series.wetBand}
              style={{ data: { fill: colors.wet, fillOpacity: 0.24, stroke: 'none' } }}
            />
            <VictoryLine
              data={series.dewPoint}
              style={{ data: { stroke: colors.dew, strokeWidth: 2 } }}
            />
            <VictoryLine
              data={series.air}
              style={{ data: { stroke: colors.air, strokeWidth: 2 } }}
            />
            <VictoryLine
              data={series.surface}
              style={{ data: { stroke: colors.iron, strokeWidth: 2.5 } }}
            />
          </VictoryChart>
        ) : null}
        {width > 0 && !series.hasData ? (
          <View style={styles.empty}>
            <Text style={type.small}>No readings in the last 24 hours.</Text>
          </View>
        ) : null}
      </View>
      <Text style={[type.small, styles.note]} testID="zone-chart-note">
        Times in {timeZone} · <Text testID="zone-chart-count">{readingCount}</Text>{' '}
        {readingCount === 1 ? 'reading' : 'readings'}
      </Text>
    </View>
  );
}

function Legend({ dewWords }: { dewWords: string }) {
  return (
    <View style={styles.legend}>
      <Key color={colors.air} label="air" />
      <Key color={colors.iron} label="surface" />
      <Key color={colors.dew} label={dewWords} testID="chart-key-dew" />
      <Key color={colors.wet} label="wet band" swatch />
      <Key color={colors.close} label="close band" swatch />
    </View>
  );
}

interface KeyProps {
  color: string;
  label: string;
  swatch?: boolean;
  testID?: string;
}

function Key({ color, label, swatch = false, testID }: KeyProps) {
  return (
    <View style={styles.key}>
      <View
        style={
          swatch
            ? [styles.swatch, { backgroundColor: color, opacity: 0.35 }]
            : [styles.line, { backgroundColor: color }]
        }
      />
      <Text style={type.small} testID={testID}>
        {label}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm },
  legend: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.lg, rowGap: space.xs },
  key: { flexDirection: 'row', alignItems: 'center', gap: space.xs + 2 },
  line: { width: 16, height: 3, borderRadius: 2 },
  swatch: { width: 12, height: 12, borderRadius: 2 },
  empty: {
    position: 'absolute',
    top: 0,
    right: 0,
    bottom: 0,
    left: 0,
    alignItems: 'center',
    justifyContent: 'center',
  },
  note: { alignSelf: 'flex-end' },
});
