import { StyleSheet, Text, View } from 'react-native';

import type { LatestReading } from '@/components/queries';
import { colors, fonts, space, tabular, type } from '@/components/theme';
import { Flash } from '@/components/ui';
import type { TemperatureUnit } from '@/ingest/units';
import {
  capitalised,
  dewPointLabel,
  formatMargin,
  formatPercent,
  formatTemperature,
} from '@/ingest/words';

interface ZoneReadingsProps {
  latest: Pick<
    LatestReading,
    'dewPoint' | 'surface' | 'surfaceSource' | 'air' | 'rh' | 'emc' | 'margin'
  > | null;
  unit: TemperatureUnit;
  /** The zone's RH limit: a reading above it is marked with words, not colour alone. */
  humidRhPct: number;
  /** The fifth figure: wood EMC, or the dew margin where EMC leads the card (lumber). */
  show?: 'emc' | 'margin';
}

/**
 * The readings behind a zone's lead figure, two to a row. Below 0.01 °C the dew point is a frost
 * point (ingest/psychrometrics.ts), and the label says so.
 */
export function ZoneReadings({ latest, unit, humidRhPct, show = 'emc' }: ZoneReadingsProps) {
  const rhOver = latest !== null && latest.rh > humidRhPct;
  return (
    <View style={styles.grid}>
      <Value
        label={capitalised(dewPointLabel(latest?.dewPoint))}
        testID="zone-dewpoint"
        text={formatTemperature(latest?.dewPoint, unit)}
      />
      <Value
        label={latest?.surfaceSource === 'estimate' ? 'Surface (est.)' : 'Surface'}
        testID="zone-surface"
        text={formatTemperature(latest?.surface, unit)}
      />
      <Value label="Air" testID="zone-air" text={formatTemperature(latest?.air, unit)} />
      <Value
        label="RH"
        testID="zone-rh"
        text={formatPercent(latest?.rh)}
        alert={rhOver ? `▲ Over the ${humidRhPct} % limit` : undefined}
      />
      {show === 'margin' ? (
        <Value
          label="Dew margin"
          testID="zone-margin-small"
          text={formatMargin(latest?.margin, unit)}
        />
      ) : (
        <Value label="Wood EMC" testID="zone-emc" text={formatPercent(latest?.emc, 1)} />
      )}
    </View>
  );
}

interface ValueProps {
  label: string;
  testID: string;
  /** The value as shown; it flashes only when what a person sees changes. */
  text: string;
  /** Words under the value when it is past a limit (shown in the wet colour, in bold). */
  alert?: string;
}

function Value({ label, testID, text, alert }: ValueProps) {
  return (
    <View style={styles.cell}>
      <Text style={type.small} testID={`${testID}-label`}>
        {label}
      </Text>
      <Flash value={text} style={styles.valueFlash}>
        <Text
          style={[type.body, tabular, styles.value, alert ? styles.over : null]}
          testID={testID}
        >
          {text}
        </Text>
      </Flash>
      {alert ? (
        <Text style={styles.alert} testID={`${testID}-over`}>
          {alert}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  grid: { flexDirection: 'row', flexWrap: 'wrap', rowGap: space.sm },
  cell: { width: '50%', gap: 2 },
  valueFlash: { alignSelf: 'flex-start', paddingHorizontal: 2, marginLeft: -2 },
  value: { fontSize: 15 },
  over: { fontFamily: fonts.bold, color: colors.wet },
  alert: { fontFamily: fonts.bold, fontSize: 12, lineHeight: 16, color: colors.wet },
});
