import { useMemo, useState } from 'react';
import { StyleSheet, Text, View, type LayoutChangeEvent } from 'react-native';
import { VictoryAxis, VictoryChart, VictoryLine, VictoryVoronoiContainer } from 'victory';

import type { ReadingPoint } from '@/components/queries';
import { colors, space, type } from '@/components/theme';
import { HISTORY_WORDS } from '@/ingest/words';

import { gapThresholdMs, type XY } from './chartSeries';
import { axisTicks } from './chartTicks';
import { CROSSHAIR_STYLE, PADDING, TIME_AXIS_STYLE, VALUE_AXIS_STYLE } from './MarginChart';

interface HumidityChartProps {
  points: ReadingPoint[];
  fromMs: number;
  toMs: number;
  bucketSeconds: number;
  timeZone: string;
  activeIndex: number | null;
  onPointAt: (atMs: number) => void;
  height?: number;
}

// RH solid in the air colour (it is the air's), EMC dashed in the iron colour: they part
// without colour too.
const RH_STYLE = { stroke: colors.air, strokeWidth: 2 };
const EMC_STYLE = { stroke: colors.iron, strokeWidth: 2, strokeDasharray: '8,4' };

/** RH and wood EMC lines, with the same gaps as the temperature chart. */
function humiditySeries(points: ReadingPoint[], bucketSeconds: number) {
  const times = points.map((p) => Date.parse(p.at));
  const gapMs = gapThresholdMs(times, bucketSeconds);
  const rh: XY[] = [];
  const emc: XY[] = [];
  let high = 0;
  points.forEach((point, i) => {
    const t = times[i]!;
    if (i > 0 && t - times[i - 1]! > gapMs) {
      const x = new Date(times[i - 1]! + (t - times[i - 1]!) / 2);
      rh.push({ x, y: null });
      emc.push({ x, y: null });
    }
    rh.push({ x: new Date(t), y: point.rh });
    emc.push({ x: new Date(t), y: point.emc });
    high = Math.max(high, point.rh, point.emc ?? 0);
  });
  // Percent from 0, to the next 20 above the highest value (at most 100).
  return { rh, emc, yMax: Math.min(100, Math.max(20, Math.ceil((high + 1) / 20) * 20)) };
}

/**
 * The air's relative humidity and the wood EMC it leads to, under the temperatures, on the
 * same time axis and with the same crosshair.
 */
export function HumidityChart({
  points,
  fromMs,
  toMs,
  bucketSeconds,
  timeZone,
  activeIndex,
  onPointAt,
  height = 150,
}: HumidityChartProps) {
  const [width, setWidth] = useState(0);
  const series = useMemo(() => humiditySeries(points, bucketSeconds), [points, bucketSeconds]);
  const axis = useMemo(
    () => axisTicks(fromMs, toMs, timeZone, Math.max(width - 56, 1)),
    [fromMs, toMs, timeZone, width],
  );
  const active = activeIndex === null ? undefined : points[activeIndex];
  const onLayout = (event: LayoutChangeEvent) => {
    const next = Math.round(event.nativeEvent.layout.width);
    if (next !== width) setWidth(next);
  };
  if (points.length === 0) return null;
  return (
    <View style={styles.box} testID="zone-humidity-chart">
      <Text style={type.label} role="heading" aria-level={4}>
        {HISTORY_WORDS.humidityHeading}
      </Text>
      <View style={styles.legend}>
        <Key label={HISTORY_WORDS.rhSeries} color={RH_STYLE.stroke} dashed={false} />
        <Key label={HISTORY_WORDS.emcSeries} color={EMC_STYLE.stroke} dashed />
      </View>
      <View
        onLayout={onLayout}
        style={{ height }}
        role="img"
        aria-label={HISTORY_WORDS.humidityHeading}
      >
        {width > 0 ? (
          <VictoryChart
            width={width}
            height={height}
            padding={PADDING}
            scale={{ x: 'time', y: 'linear' }}
            domain={{ x: [new Date(fromMs), new Date(toMs)], y: [0, series.yMax] }}
            containerComponent={
              <VictoryVoronoiContainer
                responsive={false}
                // The chart's own svg is an image too: without a title it has no name.
                title={HISTORY_WORDS.humidityHeading}
                voronoiDimension="x"
                voronoiBlacklist={['cross']}
                onActivated={(found: { x?: Date | number }[]) => {
                  const x = found[0]?.x;
                  if (x !== undefined) onPointAt(Number(x));
                }}
              />
            }
          >
            <VictoryAxis
              dependentAxis
              offsetX={PADDING.left}
              crossAxis={false}
              tickValues={[0, series.yMax / 2, series.yMax]}
              tickFormat={(t: number) => `${t} %`}
              style={VALUE_AXIS_STYLE}
            />
            <VictoryAxis
              offsetY={PADDING.bottom}
              crossAxis={false}
              tickValues={axis.ticks}
              tickFormat={(t: number | Date) => axis.label(Number(t))}
              style={TIME_AXIS_STYLE}
            />
            <VictoryLine name="rh" data={series.rh} style={{ data: RH_STYLE }} />
            <VictoryLine name="emc" data={series.emc} style={{ data: EMC_STYLE }} />
            {active ? (
              <VictoryLine
                name="cross"
                data={[
                  { x: new Date(active.at), y: 0 },
                  { x: new Date(active.at), y: series.yMax },
                ]}
                style={{ data: CROSSHAIR_STYLE }}
              />
            ) : null}
          </VictoryChart>
        ) : null}
      </View>
    </View>
  );
}

function Key({ label, color, dashed }: { label: string; color: string; dashed: boolean }) {
  return (
    <View style={styles.key}>
      <View
        style={[styles.line, { borderTopColor: color, borderStyle: dashed ? 'dashed' : 'solid' }]}
      />
      <Text style={type.small}>{label}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm },
  legend: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.lg, rowGap: space.xs },
  key: { flexDirection: 'row', alignItems: 'center', gap: space.xs + 2 },
  line: { width: 22, height: 0, borderTopWidth: 2.5 },
});
