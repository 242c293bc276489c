import { StyleSheet, Text, View } from 'react-native';

import { formatLastSeen } from '@/components/format';
import type { Sensor } from '@/components/queries';
import { space, tabular, type } from '@/components/theme';
import { useNow } from '@/components/ui';
import { intervalWords } from '@/ingest/words';

const INTERVAL_SOURCE_WORDS = {
  set: 'Posts (set)',
  learned: 'Posts (learnt)',
  default: 'Posts (assumed)',
} as const;

/** What the sensors list knows of a sensor: zone, last seen, battery, interval, silence. */
export function SensorFacts({ sensor, timeZone }: { sensor: Sensor; timeZone: string }) {
  const now = useNow();
  return (
    <View style={styles.facts}>
      <Fact label="Zone" value={sensor.zoneName} />
      <Fact
        label="Last seen"
        value={sensor.lastSeenAt ? formatLastSeen(sensor.lastSeenAt, now, timeZone) : 'never'}
        testID="sensor-last-seen"
      />
      <Fact
        label="Battery"
        value={sensor.batteryV === null ? '—' : `${sensor.batteryV.toFixed(2)} V`}
        testID="sensor-battery"
      />
      <Fact
        label={INTERVAL_SOURCE_WORDS[sensor.interval.source]}
        value={intervalWords(sensor.interval.effectiveS)}
        testID="sensor-interval"
      />
      <Fact
        label="Silent after"
        value={`${Math.round(sensor.interval.silentAfterS / 60)} min quiet`}
        testID="sensor-silent-after"
      />
    </View>
  );
}

function Fact({ label, value, testID }: { label: string; value: string; testID?: string }) {
  return (
    <View style={styles.fact}>
      <Text style={type.small}>{label}</Text>
      <Text style={[type.body, tabular]} testID={testID}>
        {value}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  facts: { flexDirection: 'row', flexWrap: 'wrap', rowGap: space.sm },
  fact: { width: '33%', minWidth: 110, gap: 2 },
});
