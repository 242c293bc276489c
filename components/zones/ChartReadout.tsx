import { StyleSheet, Text } from 'react-native';

import { useUnitPref, type ReadingPoint } from '@/components/queries';
import { tabular, type } from '@/components/theme';
import { HISTORY_WORDS, pointReadout } from '@/ingest/words';

interface ChartReadoutProps {
  /** The point under the crosshair, if any. */
  active: ReadingPoint | undefined;
  /** Whether the chart has points at all (else the hint would point at nothing). */
  hasPoints: boolean;
  /** The point's time on the shop's clock. */
  clock: (atMs: number) => string;
  testID?: string;
}

/**
 * The point under a history chart's crosshair in words, or how to pick one; announced politely
 * as it changes. Set above the charts, so a phone shows it beside the point being read.
 */
export function ChartReadout({ active, hasPoints, clock, testID }: ChartReadoutProps) {
  const unit = useUnitPref();
  return (
    <Text style={[type.small, tabular, styles.readout]} aria-live="polite" testID={testID}>
      {active
        ? pointReadout(
            { ...active, marginMax: active.marginMax ?? active.margin },
            unit,
            clock(Date.parse(active.at)),
          )
        : hasPoints
          ? HISTORY_WORDS.readoutHint
          : ''}
    </Text>
  );
}

const styles = StyleSheet.create({
  readout: { minHeight: 36 },
});
