import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { Button } from '@/components/forms';
import { DAY_WINDOW, useReadingsQuery, useUnitPref, type Zone } from '@/components/queries';
import { colors, space, tabular, type } from '@/components/theme';
import { Panel } from '@/components/ui';

import { chartSpan, spanHeading } from './chartSpan';
import { shopClock, summaryLine, valueRows, type ValueRow } from './chartSummary';
import { MarginChart } from './MarginChart';

interface ZoneHistoryProps {
  shopId: string;
  zone: Zone;
  timeZone: string;
  chartHeight?: number;
}

/**
 * A zone's history as a chart, in a panel: the last 24 hours, or since the first reading for a
 * newer zone. Under the chart, the summary line (also the chart's accessible name) and a table of
 * recent values on request, so the chart has a text alternative. The heading is its own row
 * rather than the panel's title, to leave room for "updating…" beside it.
 */
export function ZoneHistory({ shopId, zone, timeZone, chartHeight }: ZoneHistoryProps) {
  const readings = useReadingsQuery(shopId, zone.id, DAY_WINDOW);
  const unit = useUnitPref();
  const [showValues, setShowValues] = useState(false);
  const data = readings.data;
  const toMs = data ? Date.parse(data.to) : Date.now();
  const span = data
    ? chartSpan({
        fromMs: Date.parse(data.from),
        toMs,
        firstAtMs: data.firstAt ? Date.parse(data.firstAt) : null,
      })
    : null;
  const heading = span ? spanHeading(span, (ms) => shopClock(ms, toMs, timeZone)) : 'Last 24 hours';
  const summary = data ? summaryLine(data.points, unit, timeZone, toMs) : '';
  return (
    <Panel>
      <View style={styles.head}>
        <Text style={type.heading} role="heading" aria-level={3} testID="zone-chart-heading">
          {heading}
        </Text>
        {readings.isFetching ? <Text style={type.small}>updating…</Text> : null}
      </View>
      {data && span ? (
        <>
          <MarginChart
            points={data.points}
            fromMs={span.fromMs}
            toMs={span.toMs}
            bucketSeconds={data.bucketSeconds}
            wetK={zone.wetK}
            cautionK={zone.cautionK}
            timeZone={timeZone}
            summary={summary}
            height={chartHeight}
          />
          <Text style={[type.body, tabular]} testID="zone-chart-summary">
            {summary}
          </Text>
          {data.points.length > 0 ? (
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
            <ValuesTable rows={valueRows(data.points, unit, timeZone, toMs)} unit={unit} />
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
