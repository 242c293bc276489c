import { StyleSheet, Text, View } from 'react-native';

import type { LatestReading } from '@/components/queries';
import { space, tabular, type } from '@/components/theme';
import { Flash } from '@/components/ui';
import type { TemperatureUnit } from '@/ingest/units';
import { capitalised, dewPointLabel, formatPercent, formatTemperature } from '@/ingest/words';

interface ZoneReadingsProps {
  latest: Pick<
    LatestReading,
    'dewPoint' | 'surface' | 'surfaceSource' | 'air' | 'rh' | 'emc'
  > | null;
  unit: TemperatureUnit;
}

/**
 * The readings behind a zone's margin, two to a row. Below 0.01 °C the dew point is a frost
 * point (ingest/psychrometrics.ts), and the label says so.
 */
export function ZoneReadings({ latest, unit }: ZoneReadingsProps) {
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
      <Value label="RH" testID="zone-rh" text={formatPercent(latest?.rh)} />
      <Value label="Wood EMC" testID="zone-emc" text={formatPercent(latest?.emc, 1)} />
    </View>
  );
}

interface ValueProps {
  label: string;
  testID: string;
  /** The value as shown; it flashes only when what a person sees changes. */
  text: string;
}

function Value({ label, testID, text }: ValueProps) {
  return (
    <View style={styles.cell}>
      <Text style={type.small} testID={`${testID}-label`}>
        {label}
      </Text>
      <Flash value={text} style={styles.valueFlash}>
        <Text style={[type.body, tabular, styles.value]} testID={testID}>
          {text}
        </Text>
      </Flash>
    </View>
  );
}

const styles = StyleSheet.create({
  grid: { flexDirection: 'row', flexWrap: 'wrap', rowGap: space.sm },
  cell: { width: '50%', gap: 2 },
  valueFlash: { alignSelf: 'flex-start', paddingHorizontal: 2, marginLeft: -2 },
  value: { fontSize: 15 },
});
