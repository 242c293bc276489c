import type { ComponentProps } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { lazyChunk } from '@/components/ui';
import { type } from '@/components/theme';

// Type-only: a value import would put the charts back into this file's chunk.
import type { HumidityChart, MarginChart } from './charts';

const loadCharts = () => import('./charts');

function ChartSpace({ height }: { height: number }) {
  return (
    <View style={[styles.space, { height }]} testID="chart-loading">
      <Text style={type.small}>Loading the chart…</Text>
    </View>
  );
}

// The charts' own default heights, for the space kept while they load.
const MARGIN_CHART_PX = 260;
const HUMIDITY_CHART_PX = 150;

/** MarginChart, fetched with Victory on first use (components/ui/lazyChunk). */
export const LazyMarginChart = lazyChunk<ComponentProps<typeof MarginChart>>(
  () => loadCharts().then((m) => m.MarginChart),
  (props) => <ChartSpace height={props.height ?? MARGIN_CHART_PX} />,
);

/** HumidityChart, from the same chunk as LazyMarginChart. */
export const LazyHumidityChart = lazyChunk<ComponentProps<typeof HumidityChart>>(
  () => loadCharts().then((m) => m.HumidityChart),
  (props) => <ChartSpace height={props.height ?? HUMIDITY_CHART_PX} />,
);

const styles = StyleSheet.create({
  space: { alignItems: 'center', justifyContent: 'center' },
});
