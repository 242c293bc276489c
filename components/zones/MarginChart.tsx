import { useMemo, useState } from 'react';
import { StyleSheet, Text, View, type LayoutChangeEvent } from 'react-native';
import {
  VictoryArea,
  VictoryAxis,
  VictoryChart,
  VictoryLine,
  VictoryScatter,
  VictoryVoronoiContainer,
} from 'victory';

import { useUnitPref, type ReadingPoint } from '@/components/queries';
import { dewPointSeriesLabel, HISTORY_WORDS } from '@/ingest/words';
import { colors, fonts, space, type } from '@/components/theme';

import { axisTicks } from './chartTicks';
import { chartSeries, seriesInUnit } from './chartSeries';

interface MarginChartProps {
  points: ReadingPoint[];
  fromMs: number;
  toMs: number;
  bucketSeconds: number;
  wetK: number;
  cautionK: number;
  timeZone: string;
  /** The chart in one line (the summary under it): the chart's accessible name. */
  summary: string;
  /** Shown when the span holds no readings: "No readings in the last 7 days." */
  emptyText: string;
  /** The point the crosshair is on (index into `points`), or null. */
  activeIndex: number | null;
  /** Called with the time the pointer is nearest to (pointer or touch). */
  onPointAt: (atMs: number) => void;
  height?: number;
  /** Events drawn over the chart as a line and a symbol at their time (the care log's coats). */
  marks?: readonly ChartMark[];
}

/** A shape per kind of event, so marks part without colour; the legend names each shape. */
export type MarkSymbol = 'triangleUp' | 'diamond';
export interface ChartMark {
  atMs: number;
  symbol: MarkSymbol;
  /** The legend's word for this symbol ("coat"). */
  key: string;
}
const MARK_GLYPHS: Record<MarkSymbol, string> = { triangleUp: '▲', diamond: '◆' };

/**
 * Each line has its own colour AND its own stroke, so the lines part without colour: air solid,
 * surface dashed (with a marker at every reading while there are few), dew point dotted.
 */
export const LINE_STYLES = {
  air: { stroke: colors.air, strokeWidth: 2, strokeDasharray: undefined },
  surface: { stroke: colors.iron, strokeWidth: 2.5, strokeDasharray: '8,4' },
  dew: { stroke: colors.dew, strokeWidth: 2, strokeDasharray: '2,3' },
} as const;

// Markers on the surface line only while they stay apart; past this they merge into a smear.
const MAX_MARKED_POINTS = 90;

export const PADDING = { top: 12, bottom: 32, left: 44, right: 12 };
export const AXIS_TEXT = { fontFamily: fonts.regular, fontSize: 11, fill: colors.iron };
const MARK_LINE_STYLE = { stroke: colors.ink, strokeWidth: 1, strokeOpacity: 0.6 };
export const CROSSHAIR_STYLE = { stroke: colors.ink, strokeWidth: 1, strokeDasharray: '3,3' };
/** The value axis of both history panels: labels and grid lines, no axis line of its own. */
export const VALUE_AXIS_STYLE = {
  axis: { stroke: 'transparent' },
  grid: { stroke: colors.border, strokeWidth: 1 },
  ticks: { stroke: 'transparent' },
  tickLabels: { ...AXIS_TEXT, padding: 6 },
};
/** The time axis of both history panels, pinned to the bottom edge. */
export const TIME_AXIS_STYLE = {
  axis: { stroke: colors.border },
  ticks: { stroke: colors.border, size: 4 },
  tickLabels: { ...AXIS_TEXT, padding: 4 },
  grid: { stroke: 'transparent' },
};

/**
 * Air, surface and dew point (frost point below 0.01 °C) over time. The band above the dew point
 * shows how close the surface may come: the wet band up to the wet limit, the close band up to
 * the caution limit. In a bucketed series a grey band spans each bucket's lowest to highest
 * margin above the dew point, so a short dip shows though the surface line is an average. The
 * crosshair marks the point the readout (ZoneHistory) reads out.
 */
export function MarginChart({
  points,
  fromMs,
  toMs,
  bucketSeconds,
  wetK,
  cautionK,
  timeZone,
  summary,
  emptyText,
  activeIndex,
  onPointAt,
  height = 260,
  marks = [],
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
  // Labels about 70 px apart: an hour's chart gets quarter hours, a week's days.
  const axis = useMemo(
    () => axisTicks(fromMs, toMs, timeZone, Math.max(width - 56, 1)),
    [fromMs, toMs, timeZone, width],
  );
  const degrees = `°${unit}`;
  const active = activeIndex === null ? undefined : points[activeIndex];
  const activeX = active ? new Date(active.at) : null;
  const showBand = bucketSeconds > 0 && series.marginBand.length > 0;
  const shownMarks = marks.filter((m) => m.atMs >= fromMs && m.atMs <= toMs);
  const markKeys = [...new Map(shownMarks.map((m) => [m.symbol, m.key])).entries()];

  const onLayout = (event: LayoutChangeEvent) => {
    const next = Math.round(event.nativeEvent.layout.width);
    if (next !== width) setWidth(next);
  };

  return (
    <View testID="zone-chart" style={styles.box}>
      <Legend dewWords={dewWords} band={showBand} markKeys={markKeys} />
      <View
        onLayout={onLayout}
        style={{ height }}
        role="img"
        accessibilityLabel={summary}
        aria-label={summary}
        testID="zone-chart-plot"
      >
        {width > 0 && series.hasData ? (
          <VictoryChart
            width={width}
            height={height}
            padding={PADDING}
            scale={{ x: 'time', y: 'linear' }}
            domain={{ x: [new Date(fromMs), new Date(toMs)], y: series.yDomain }}
            containerComponent={
              <VictoryVoronoiContainer
                responsive={false}
                title={`Air, surface and ${dewWords}`}
                desc={summary}
                voronoiDimension="x"
                voronoiBlacklist={[
                  'closeBand',
                  'wetBand',
                  'marginBand',
                  'surfaceMarks',
                  'cross',
                  ...shownMarks.map((_, i) => `mark${i}`),
                  'markSymbols',
                ]}
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
              // Not a crossing axis, so Victory keeps the 0° tick it would otherwise hide.
              crossAxis={false}
              tickFormat={(t: number) => `${t}${degrees}`}
              style={VALUE_AXIS_STYLE}
            />
            <VictoryAxis
              // Pinned to the bottom edge; by default it would cross the y axis at 0 °C.
              offsetY={PADDING.bottom}
              crossAxis={false}
              tickValues={axis.ticks}
              tickFormat={(t: number | Date) => axis.label(Number(t))}
              style={TIME_AXIS_STYLE}
            />
            <VictoryArea
              name="closeBand"
              data={series.closeBand}
              style={{ data: { fill: colors.close, fillOpacity: 0.14, stroke: 'none' } }}
            />
            <VictoryArea
              name="wetBand"
              data={series.wetBand}
              style={{ data: { fill: colors.wet, fillOpacity: 0.24, stroke: 'none' } }}
            />
            {showBand ? (
              <VictoryArea
                name="marginBand"
                data={series.marginBand}
                // Outlined as well as filled: a dip inside one bucket of a week is narrower than
                // a pixel, and only its outline shows how far down it went.
                style={{
                  data: {
                    fill: colors.iron,
                    fillOpacity: 0.22,
                    stroke: colors.iron,
                    strokeOpacity: 0.7,
                    strokeWidth: 1,
                  },
                }}
              />
            ) : null}
            <VictoryLine name="dew" data={series.dewPoint} style={{ data: LINE_STYLES.dew }} />
            <VictoryLine name="air" data={series.air} style={{ data: LINE_STYLES.air }} />
            <VictoryLine
              name="surface"
              data={series.surface}
              style={{ data: LINE_STYLES.surface }}
            />
            {series.surface.length <= MAX_MARKED_POINTS ? (
              <VictoryScatter
                name="surfaceMarks"
                data={series.surface.filter((p) => p.y !== null)}
                size={2.5}
                style={{ data: { fill: colors.card, stroke: colors.iron, strokeWidth: 1.5 } }}
              />
            ) : null}
            {shownMarks.map((mark, i) => (
              <VictoryLine
                key={`mark${i}`}
                name={`mark${i}`}
                data={[
                  { x: new Date(mark.atMs), y: series.yDomain[0] },
                  { x: new Date(mark.atMs), y: series.yDomain[1] },
                ]}
                style={{ data: MARK_LINE_STYLE }}
              />
            ))}
            {shownMarks.length > 0 ? (
              <VictoryScatter
                name="markSymbols"
                data={shownMarks.map((m) => ({
                  x: new Date(m.atMs),
                  y: series.yDomain[1],
                  symbol: m.symbol,
                }))}
                size={6}
                style={{ data: { fill: colors.ink, stroke: colors.card, strokeWidth: 1 } }}
              />
            ) : null}
            {activeX ? (
              <VictoryLine
                name="cross"
                data={[
                  { x: activeX, y: series.yDomain[0] },
                  { x: activeX, y: series.yDomain[1] },
                ]}
                style={{ data: CROSSHAIR_STYLE }}
              />
            ) : null}
          </VictoryChart>
        ) : null}
        {width > 0 && !series.hasData ? (
          <View style={styles.empty}>
            <Text style={type.small}>{emptyText}</Text>
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

interface LegendProps {
  dewWords: string;
  band: boolean;
  markKeys: readonly (readonly [MarkSymbol, string])[];
}

function Legend({ dewWords, band, markKeys }: LegendProps) {
  return (
    <View style={styles.legend} testID="chart-legend">
      <Key line={LINE_STYLES.air} label="air" />
      <Key line={LINE_STYLES.surface} label="surface" marker />
      <Key line={LINE_STYLES.dew} label={dewWords} testID="chart-key-dew" />
      <Swatch color={colors.wet} label="wet band" />
      <Swatch color={colors.close} label="close band" />
      {band ? <Swatch color={colors.iron} label={HISTORY_WORDS.marginBand} /> : null}
      {markKeys.map(([symbol, key]) => (
        <View key={symbol} style={styles.key}>
          <Text style={[type.small, styles.glyph]} aria-hidden>
            {MARK_GLYPHS[symbol]}
          </Text>
          <Text style={type.small}>{key}</Text>
        </View>
      ))}
    </View>
  );
}

interface KeyProps {
  line: { stroke: string; strokeWidth: number; strokeDasharray: string | undefined };
  label: string;
  marker?: boolean;
  testID?: string;
}

/** A line's key drawn as the line is: its colour, its dash, its marker. */
function Key({ line, label, marker = false, testID }: KeyProps) {
  const borderStyle =
    line.strokeDasharray === undefined
      ? 'solid'
      : line.strokeDasharray.startsWith('2')
        ? 'dotted'
        : 'dashed';
  return (
    <View style={styles.key}>
      <View style={styles.sample}>
        <View
          style={[
            styles.line,
            { borderTopColor: line.stroke, borderTopWidth: line.strokeWidth + 0.5, borderStyle },
          ]}
        />
        {marker ? <View style={[styles.marker, { borderColor: line.stroke }]} /> : null}
      </View>
      <Text style={type.small} testID={testID}>
        {label}
      </Text>
    </View>
  );
}

function Swatch({ color, label }: { color: string; label: string }) {
  return (
    <View style={styles.key}>
      <View style={[styles.swatch, { backgroundColor: color, opacity: 0.35 }]} />
      <Text style={type.small}>{label}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm },
  legend: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.lg, rowGap: space.xs },
  key: { flexDirection: 'row', alignItems: 'center', gap: space.xs + 2 },
  sample: { width: 22, height: 10, justifyContent: 'center', alignItems: 'center' },
  line: { width: 22, height: 0 },
  marker: {
    position: 'absolute',
    width: 7,
    height: 7,
    borderRadius: 4,
    borderWidth: 1.5,
    backgroundColor: colors.card,
  },
  glyph: { color: colors.ink },
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
