import { useMemo, useState } from 'react';
import { StyleSheet, Text } from 'react-native';

import {
  useReadingsQuery,
  useUnitPref,
  type CareEntry,
  type ReadingsWindow,
  type Zone,
} from '@/components/queries';
import { colors, tabular, type } from '@/components/theme';
import { Panel } from '@/components/ui';
import { nearestIndex } from '@/components/zones/chartSeries';
import { shopClock, summaryLine } from '@/components/zones/chartSummary';
import { ChartKeys } from '@/components/zones/ChartKeys';
import { ChartReadout } from '@/components/zones/ChartReadout';
import { LazyMarginChart } from '@/components/zones/LazyCharts';
import type { ChartMark } from '@/components/zones/MarginChart';
import { CARE_KIND_WORDS, HISTORY_WORDS } from '@/ingest/words';

import { careMarks, chartHours, marksLine } from './careText';

const POINTS = 500;

interface SurfaceChartProps {
  shopId: string;
  zone: Zone;
  care: readonly CareEntry[];
  timeZone: string;
  nowMs: number;
}

/**
 * The zone's margin back to the surface's oldest care entry (6 hours to 30 days), with a mark
 * at each coat (▲) and inspection (◆). A sliding window, so live readings extend it.
 */
export function SurfaceChart({ shopId, zone, care, timeZone, nowMs }: SurfaceChartProps) {
  const hours = chartHours(care, nowMs);
  const window: ReadingsWindow = useMemo(() => ({ hours, points: POINTS }), [hours]);
  const readings = useReadingsQuery(shopId, zone.id, window);
  const unit = useUnitPref();
  const [activeIndex, setActiveIndex] = useState<number | null>(null);
  const data = readings.data;
  const points = useMemo(() => data?.points ?? [], [data]);
  const times = useMemo(() => points.map((p) => Date.parse(p.at)), [points]);
  const fromMs = data ? Date.parse(data.from) : nowMs - hours * 3_600_000;
  const toMs = data ? Math.max(Date.parse(data.to), times.at(-1) ?? 0) : nowMs;
  const spanWords =
    hours <= 48 ? `in the last ${hours} hours` : `in the last ${Math.round(hours / 24)} days`;
  const summary = data ? summaryLine(points, unit, timeZone, toMs, spanWords, toMs - fromMs) : '';
  const active =
    activeIndex !== null && activeIndex < points.length ? points[activeIndex] : undefined;
  const marks: ChartMark[] = careMarks(care, fromMs, toMs).map((m) => ({
    atMs: m.atMs,
    symbol: m.kind === 'coating' ? 'triangleUp' : 'diamond',
    key: CARE_KIND_WORDS[m.kind].toLowerCase(),
  }));
  return (
    <Panel title={`${zone.name}: dew margin and care`} testID="surface-chart">
      {data ? (
        <>
          <ChartReadout
            active={active}
            hasPoints={points.length > 0}
            clock={(atMs) => shopClock(atMs, toMs, timeZone, toMs - fromMs)}
          />
          <ChartKeys
            count={points.length}
            activeIndex={activeIndex}
            onMove={setActiveIndex}
            label={`${summary}. ${HISTORY_WORDS.readoutHint}`}
          >
            <LazyMarginChart
              points={points}
              fromMs={fromMs}
              toMs={toMs}
              bucketSeconds={data.bucketSeconds}
              wetK={zone.wetK}
              cautionK={zone.cautionK}
              timeZone={timeZone}
              summary={summary}
              emptyText={`No readings ${spanWords}.`}
              activeIndex={active ? activeIndex : null}
              onPointAt={(atMs) => setActiveIndex(nearestIndex(times, atMs))}
              marks={marks}
            />
          </ChartKeys>
          <Text style={[type.body, tabular]} testID="surface-chart-summary">
            {summary}
          </Text>
          <Text style={type.small} testID="surface-chart-marks">
            {marksLine(marks.length, points.length > 0)}
          </Text>
        </>
      ) : readings.isError ? (
        <Text style={[type.body, styles.error]}>{readings.error.message}</Text>
      ) : (
        <Text style={type.small}>Loading readings…</Text>
      )}
    </Panel>
  );
}

const styles = StyleSheet.create({
  error: { color: colors.wet },
});
