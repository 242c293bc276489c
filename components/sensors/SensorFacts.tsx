import { StyleSheet, Text, View } from 'react-native';

import { formatLastSeen } from '@/components/format';
import type { Sensor } from '@/components/queries';
import { space, tabular, type } from '@/components/theme';
import { useNow } from '@/components/ui';
import { intervalWords, mqttReadingsTopic, MQTT_TOPIC_LABEL } from '@/ingest/words';

const INTERVAL_SOURCE_WORDS = {
  set: 'Posts (set)',
  learned: 'Posts (learnt)',
  default: 'Posts (assumed)',
} as const;

interface SensorFactsProps {
  sensor: Sensor;
  timeZone: string;
  /** The server takes readings over MQTT too: show the sensor's topic. */
  mqttOn?: boolean;
}

/** What the sensors list knows of a sensor: zone, last seen, battery, topic, interval, silence. */
export function SensorFacts({ sensor, timeZone, mqttOn = false }: SensorFactsProps) {
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
      {mqttOn ? (
        <Fact
          label={MQTT_TOPIC_LABEL}
          value={mqttReadingsTopic(sensor.id)}
          testID="sensor-mqtt-topic"
        />
      ) : null}
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
