import { Platform, StyleSheet, Text, View } from 'react-native';

import { colors, fonts, radius, space, type } from '@/components/theme';
import { Panel } from '@/components/ui';
import type { TemperatureUnit } from '@/ingest/units';
import {
  exampleReadingJson,
  HTTP_WAY_TEXT,
  MQTT_ACKS_LABEL,
  MQTT_BROKER_LABEL,
  MQTT_OFF_TEXT,
  MQTT_WAY_TEXT,
  mqttAcksTopic,
  mqttPublishExample,
  WAYS_IN_HINT,
  WAYS_IN_TITLE,
} from '@/ingest/words';

/**
 * A ready command for the sensor's first reading, as in the HTTP contract (API.md), in the
 * reader's unit. Its values leave a new zone dry (ingest/words/sensors.ts says why).
 */
export function curlExample(origin: string, token: string, unit: TemperatureUnit = 'C'): string {
  return [
    `curl -X POST ${origin}/api/v1/ingest \\`,
    `  -H 'Authorization: Bearer ${token}' \\`,
    `  -H 'Content-Type: application/json' \\`,
    `  -d '${exampleReadingJson(unit)}'`,
  ].join('\n');
}

/** The origin sensors post to: this page's own, as the browser sees it. */
export function apiOrigin(): string {
  return Platform.OS === 'web' && typeof window !== 'undefined'
    ? window.location.origin
    : 'https://drybench.example';
}

interface SensorWaysInProps {
  /** The broker sensors connect to; null when the server takes no MQTT. */
  mqttUrl: string | null;
  /** A sensor to write the examples for (its id goes in the topic); null before the first. */
  example: { id: string; name: string } | null;
  unit: TemperatureUnit;
}

/**
 * Both ways a sensor sends readings, with a ready example of each: a curl POST and an MQTT
 * publish. Tokens are shown only once, so the examples carry `$TOKEN` in their place.
 */
export function SensorWaysIn({ mqttUrl, example, unit }: SensorWaysInProps) {
  const sensorId = example?.id ?? '<sensor id>';
  return (
    <Panel title={WAYS_IN_TITLE} hint={WAYS_IN_HINT} testID="sensor-ways-in">
      <Text style={type.body}>{HTTP_WAY_TEXT}</Text>
      <Text selectable style={styles.code} testID="ways-in-curl">
        {curlExample(apiOrigin(), '$TOKEN', unit)}
      </Text>
      {mqttUrl ? (
        <>
          <Text style={type.body}>{MQTT_WAY_TEXT}</Text>
          <View style={styles.fact}>
            <Text style={type.small}>{MQTT_BROKER_LABEL}</Text>
            <Text selectable style={[type.body, styles.mono]} testID="mqtt-broker">
              {mqttUrl}
            </Text>
          </View>
          {example ? (
            <View style={styles.fact}>
              <Text style={type.small}>
                {MQTT_ACKS_LABEL} ({example.name})
              </Text>
              <Text selectable style={[type.body, styles.mono]}>
                {mqttAcksTopic(example.id)}
              </Text>
            </View>
          ) : null}
          <Text selectable style={styles.code} testID="ways-in-mqtt">
            {mqttPublishExample(mqttUrl, sensorId, '$TOKEN', unit)}
          </Text>
        </>
      ) : (
        <Text style={type.small} testID="mqtt-off">
          {MQTT_OFF_TEXT}
        </Text>
      )}
    </Panel>
  );
}

export const codeStyle = StyleSheet.create({
  code: {
    fontFamily: fonts.regular,
    fontSize: 13,
    lineHeight: 19,
    color: colors.ink,
    backgroundColor: colors.paper,
    borderColor: colors.border,
    borderWidth: 1,
    borderRadius: radius.control,
    padding: space.md,
  },
}).code;

const styles = StyleSheet.create({
  code: codeStyle,
  fact: { gap: 2 },
  mono: { fontFamily: fonts.regular },
});
