import { useMemo, useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { Button, Choice } from '@/components/forms';
import {
  useReadingsQuery,
  useUnitPref,
  type ReadingsWindow,
  type Zone,
} from '@/components/queries';
import { colors, space, tabular, type } from '@/components/theme';
import { Panel } from '@/components/ui';
import { HISTORY_WORDS } from '@/ingest/words';

import { DEFAULT_RANGE, RANGES, rangeHeading, rangeMs, type RangeKey } from './chartRange';
import { chartSpan, spanHeading } from './chartSpan';
import { nearestIndex } from './chartSeries';
import { shopClock, summaryLine, valueRows, type ValueRow } from './chartSummary';
import { ChartKeys } from './ChartKeys';
import { ChartReadout } from './ChartReadout';
import { CustomRange } from './CustomRange';
import { LazyHumidityChart, LazyMarginChart } from './LazyCharts';

interface ZoneHistoryProps {
  shopId: string;
  zone: Zone;
  timeZone: string;
  chartHeight?: number;
  /** The range shown, when the screen keeps it (in the URL); else the panel keeps its own. */
  range?: RangeKey;
  onRangeChange?: (range: RangeKey) => void;
}

const POINTS = 500;
const HOUR_MS = 3_600_000;

/**
 * A zone's history as charts, in a panel: a range switch (6 h, 24 h, 7 days, 30 days or a
 * custom span on the shop's clock), the temperatures with the dew point and the margin's bands,
 * RH and wood EMC under them, and a readout of the point under the crosshair (pointer, touch or
 * arrow keys). Under the charts, the summary line (also the chart's accessible name) and a table
 * of recent values on request, so the chart has a text alternative.
 */
export function ZoneHistory({
  shopId,
  zone,
  timeZone,
  chartHeight,
  range: rangeProp,
  onRangeChange,
}: ZoneHistoryProps) {
  const [ownRange, setOwnRange] = useState<RangeKey>(DEFAULT_RANGE);
  const range = rangeProp ?? ownRange;
  const setRange = (next: RangeKey) => {
    setOwnRange(next);
    onRangeChange?.(next);
    setActiveIndex(null);
  };
  const [custom, setCustom] = useState<{ fromMs: number; toMs: number } | null>(null);
  const [activeIndex, setActiveIndex] = useState<number | null>(null);
  const window: ReadingsWindow = useMemo(
    () =>
      range === 'custom' && custom
        ? { fromMs: custom.fromMs, toMs: custom.toMs, points: POINTS }
        : { hours: rangeMs(range === 'custom' ? DEFAULT_RANGE : range) / HOUR_MS, points: POINTS },
    [range, custom],
  );
  const readings = useReadingsQuery(shopId, zone.id, window);
  const unit = useUnitPref();
  const [showValues, setShowValues] = useState(false);
  const data = readings.data;
  const toMs = data ? Date.parse(data.to) : Date.now();
  const span = data
    ? chartSpan({
        fromMs: Date.parse(data.from),
        toMs,
        // A newer zone's day fills the chart from its first reading; a week or a month asked
        // for is shown whole, so the span matches the switch.
        firstAtMs:
          data.firstAt && (range === '6h' || range === '24h') ? Date.parse(data.firstAt) : null,
      })
    : null;
  const spanMs = span ? span.toMs - span.fromMs : 0;
  const clock = (ms: number) => shopClock(ms, toMs, timeZone, spanMs);
  const shownRange: RangeKey = range === 'custom' && !custom ? DEFAULT_RANGE : range;
  const heading =
    shownRange === 'custom' && custom
      ? `${shopClock(custom.fromMs, custom.toMs, timeZone, 7 * 86_400_000)} – ${shopClock(custom.toMs, custom.toMs, timeZone, 7 * 86_400_000)}`
      : span?.partial
        ? spanHeading(span, clock)
        : rangeHeading(shownRange);
  const spanWords =
    shownRange === 'custom'
      ? 'in this span'
      : span?.partial
        ? 'since the first reading'
        : (RANGES.find((r) => r.value === shownRange)?.words ?? 'in this span');
  const points = useMemo(() => data?.points ?? [], [data]);
  const summary = data ? summaryLine(points, unit, timeZone, toMs, spanWords, spanMs) : '';
  const times = useMemo(() => points.map((p) => Date.parse(p.at)), [points]);
  const active =
    activeIndex !== null && activeIndex < points.length ? points[activeIndex] : undefined;
  const pointAt = (atMs: number) => setActiveIndex(nearestIndex(times, atMs));

  return (
    <Panel>
      <View style={styles.head}>
        <Text style={type.heading} role="heading" aria-level={3} testID="zone-chart-heading">
          {heading}
        </Text>
        {readings.isFetching ? <Text style={type.small}>updating…</Text> : null}
      </View>
      <Choice
        label={HISTORY_WORDS.rangeLabel}
        options={RANGES}
        value={range}
        onChange={setRange}
        testID="zone-range"
      />
      {range === 'custom' ? (
        <CustomRange
          timeZone={timeZone}
          initial={custom ?? { fromMs: toMs - 7 * 86_400_000, toMs }}
          onApply={(next) => {
            setCustom(next);
            setActiveIndex(null);
          }}
        />
      ) : null}
      {data && span ? (
        <>
          <ChartReadout
            active={active}
            hasPoints={points.length > 0}
            clock={clock}
            testID="zone-chart-readout"
          />
          <ChartKeys
            count={points.length}
            activeIndex={activeIndex}
            onMove={setActiveIndex}
            label={`${summary}. ${HISTORY_WORDS.readoutHint}`}
          >
            <LazyMarginChart
              points={points}
              fromMs={span.fromMs}
              toMs={span.toMs}
              bucketSeconds={data.bucketSeconds}
              wetK={zone.wetK}
              cautionK={zone.cautionK}
              timeZone={timeZone}
              summary={summary}
              emptyText={`No readings ${spanWords}.`}
              activeIndex={active ? activeIndex : null}
              onPointAt={pointAt}
              height={chartHeight}
            />
            <LazyHumidityChart
              points={points}
              fromMs={span.fromMs}
              toMs={span.toMs}
              bucketSeconds={data.bucketSeconds}
              timeZone={timeZone}
              activeIndex={active ? activeIndex : null}
              onPointAt={pointAt}
            />
          </ChartKeys>
          <Text style={[type.body, tabular]} testID="zone-chart-summary">
            {summary}
          </Text>
          {points.length > 0 ? (
            <View style={styles.toggle}>
              <Button
                label={showValues ? 'Hide values' : 'Show values'}
                variant="quiet"
                onPress={() => setShowValues((shown) => !shown)}
                testID="zone-values-toggle"
              />
            </View>
          ) : null}
          {showValues ? (
            <ValuesTable rows={valueRows(points, unit, timeZone, toMs, 12, spanMs)} unit={unit} />
          ) : null}
        </>
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

const COLUMNS: { key: keyof Omit<ValueRow, 'key'>; label: string }[] = [
  { key: 'time', label: 'Time' },
  { key: 'surface', label: 'Surface' },
  { key: 'dewPoint', label: 'Dew point' },
  { key: 'margin', label: 'Margin' },
];

/** The newest values, newest first: the chart's numbers for anyone who cannot read the lines. */
function ValuesTable({ rows, unit }: { rows: ValueRow[]; unit: string }) {
  return (
    <View
      role="table"
      aria-label={`Recent values in °${unit}, newest first`}
      style={styles.table}
      testID="zone-values"
    >
      <View role="row" style={[styles.row, styles.headRow]}>
        {COLUMNS.map((column) => (
          <Text key={column.key} role="columnheader" style={[type.label, styles.cell]}>
            {column.label}
          </Text>
        ))}
      </View>
      {rows.map((row) => (
        <View key={row.key} role="row" style={styles.row} testID="zone-values-row">
          {COLUMNS.map((column) => (
            <Text key={column.key} role="cell" style={[type.body, tabular, styles.cell]}>
              {row[column.key]}
            </Text>
          ))}
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  head: { flexDirection: 'row', alignItems: 'baseline', justifyContent: 'space-between' },
  placeholder: { alignItems: 'center', justifyContent: 'center' },
  error: { color: colors.wet },
  toggle: { alignSelf: 'flex-start' },
  table: { borderTopWidth: 1, borderTopColor: colors.border },
  row: {
    flexDirection: 'row',
    paddingVertical: space.xs,
    borderBottomWidth: 1,
    borderBottomColor: colors.border,
  },
  headRow: { paddingVertical: space.sm },
  cell: { flex: 1, minWidth: 0, fontSize: 13 },
});
