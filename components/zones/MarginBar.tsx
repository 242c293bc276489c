import { StyleSheet, Text, View } from 'react-native';

import type { TemperatureUnit } from '@/ingest/units';
import { deltaInUnit, formatMargin } from '@/components/format';
import { colors, tabular, type } from '@/components/theme';

import { marginScale } from './marginScale';

interface MarginBarProps {
  marginK: number | null;
  wetK: number;
  cautionK: number;
  unit?: TemperatureUnit;
}

function pct(fraction: number): `${number}%` {
  return `${fraction * 100}%`;
}

/** A small bar placing the dew margin between the zone's wet and caution limits. */
export function MarginBar({ marginK, wetK, cautionK, unit = 'C' }: MarginBarProps) {
  const scale = marginScale(marginK, wetK, cautionK);
  const description =
    `Dew margin ${formatMargin(marginK, unit)}; wet at ${deltaInUnit(wetK, unit)} °${unit} ` +
    `or less, dry from ${deltaInUnit(cautionK, unit)} °${unit}`;
  return (
    <View accessibilityLabel={description} aria-label={description} testID="zone-margin-bar">
      <View style={styles.track}>
        <View style={[styles.segment, { left: 0, width: pct(scale.wetAt) }, styles.wet]} />
        <View
          style={[
            styles.segment,
            { left: pct(scale.wetAt), width: pct(scale.cautionAt - scale.wetAt) },
            styles.close,
          ]}
        />
        <View
          style={[
            styles.segment,
            { left: pct(scale.cautionAt), width: pct(1 - scale.cautionAt) },
            styles.dry,
          ]}
        />
        {scale.markerAt === null ? null : (
          <View style={[styles.marker, { left: pct(scale.markerAt) }]} />
        )}
      </View>
      <View style={styles.labels}>
        <Text
          style={[type.small, tabular, styles.label, { left: pct(scale.wetAt) }]}
          testID="margin-bar-wet"
        >
          {deltaInUnit(wetK, unit)} °{unit}
        </Text>
        <Text
          style={[type.small, tabular, styles.label, { left: pct(scale.cautionAt) }]}
          testID="margin-bar-caution"
        >
          {deltaInUnit(cautionK, unit)} °{unit}
        </Text>
      </View>
    </View>
  );
}

const TRACK_HEIGHT = 6;
// Room for "-12.6 °F" at the labels' 11 px.
const LABEL_WIDTH = 60;

const styles = StyleSheet.create({
  track: {
    height: TRACK_HEIGHT + 8,
    justifyContent: 'center',
  },
  segment: { position: 'absolute', height: TRACK_HEIGHT, top: 4 },
  wet: {
    backgroundColor: colors.wet,
    opacity: 0.35,
    borderTopLeftRadius: 3,
    borderBottomLeftRadius: 3,
  },
  close: { backgroundColor: colors.close, opacity: 0.3 },
  dry: {
    backgroundColor: colors.dry,
    opacity: 0.3,
    borderTopRightRadius: 3,
    borderBottomRightRadius: 3,
  },
  marker: {
    position: 'absolute',
    top: 0,
    width: 4,
    marginLeft: -2,
    height: TRACK_HEIGHT + 8,
    borderRadius: 2,
    backgroundColor: colors.ink,
  },
  labels: { height: 16, marginTop: 2 },
  label: {
    position: 'absolute',
    width: LABEL_WIDTH,
    marginLeft: -LABEL_WIDTH / 2,
    textAlign: 'center',
    fontSize: 11,
  },
});
