import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { formatLastSeen, formatMargin } from '@/components/format';
import { Button } from '@/components/forms';
import { useSensorsQuery, useUnitPref, useZonesQuery } from '@/components/queries';
import { colors, fonts, radius, space, tabular, type } from '@/components/theme';
import { Panel, useNow } from '@/components/ui';
import {
  postingInterval,
  RECOMMENDED_INTERVAL_S,
  SILENT_AFTER_INTERVALS,
} from '@/ingest/postingInterval';
import { READING_FIELD_GUIDE } from '@/ingest/readingFields';
import { cToF, type TemperatureUnit } from '@/ingest/units';
import {
  firstReadingText,
  READING_FIELD_WORDS,
  levelWordInline,
  mqttPublishExample,
} from '@/ingest/words';

import { apiOrigin, codeStyle, curlExample } from './SensorWaysIn';

interface TokenRevealProps {
  shopId: string;
  /** The broker, for an MQTT example beside the curl one; null when MQTT is off. */
  mqttUrl: string | null;
  sensorId: string;
  sensorName: string;
  token: string;
  timeZone: string;
  onDone: () => void;
}

async function copy(text: string): Promise<boolean> {
  try {
    await navigator.clipboard.writeText(text);
    return true;
  } catch {
    return false;
  }
}

/** A field's unit and range as the reader reads them: "°F, -76 to 185", "%, 0 to 100". */
function fieldRange(guide: (typeof READING_FIELD_GUIDE)[number], unit: TemperatureUnit): string {
  const { kind, min, max } = guide;
  if (kind === 'time' || kind === 'unit' || min === undefined || max === undefined) return '';
  if (kind === 'temperature') {
    const t = (c: number) => (unit === 'F' ? Math.round(cToF(c)) : c);
    const how = unit === 'F' ? '°F, with "unit": "F"' : '°C';
    return `${how}, ${t(min)} to ${t(max)}`;
  }
  return kind === 'percent' ? `%, ${min} to ${max}` : `V, ${min} to ${max}`;
}

/**
 * The one time a sensor's token is shown (it is stored only as a hash): the token with a copy
 * button, what a reading may carry and how often to send it, a curl command that posts a first
 * reading with it, and — live, from the socket's reading message — when that reading arrives.
 */
export function TokenReveal({
  shopId,
  sensorId,
  sensorName,
  token,
  timeZone,
  mqttUrl,
  onDone,
}: TokenRevealProps) {
  const unit = useUnitPref();
  const [copied, setCopied] = useState<'token' | 'curl' | 'failed' | null>(null);
  const command = curlExample(apiOrigin(), token, unit);
  const copyThis = async (what: 'token' | 'curl') =>
    setCopied((await copy(what === 'token' ? token : command)) ? what : 'failed');
  const fallback = postingInterval(null, null);

  return (
    <Panel
      title={`Token for ${sensorName}`}
      hint="Shown this once: Drybench keeps only a fingerprint of it. Put it in the sensor now."
      testID="token-reveal"
    >
      <Text selectable style={styles.code} testID="sensor-token" accessibilityLabel="Sensor token">
        {token}
      </Text>
      <View style={styles.row}>
        <Button
          label="Copy token"
          accessibilityLabel={`Copy token of ${sensorName}`}
          onPress={() => void copyThis('token')}
          testID="copy-token"
        />
        <Button
          label="Copy curl command"
          variant="quiet"
          onPress={() => void copyThis('curl')}
          testID="copy-curl"
        />
      </View>
      <Text style={type.small} role="status" aria-live="polite" testID="copy-status">
        {copied === 'token'
          ? 'Token copied.'
          : copied === 'curl'
            ? 'Command copied.'
            : copied === 'failed'
              ? 'This browser refused to copy; select the text and copy it by hand.'
              : ' '}
      </Text>

      <Text style={type.label} role="heading" aria-level={3}>
        What a reading may carry
      </Text>
      <View style={styles.fields} testID="token-fields">
        {READING_FIELD_GUIDE.map((guide) => (
          <View key={guide.field} style={styles.field} testID={`token-field-${guide.field}`}>
            <Text style={styles.fieldName}>{guide.field}</Text>
            <View style={styles.fieldText}>
              <Text style={type.body}>{READING_FIELD_WORDS[guide.field]}</Text>
              <Text style={[type.small, tabular]}>
                {[fieldRange(guide, unit), guide.required ? 'required' : 'optional']
                  .filter(Boolean)
                  .join(' · ')}
              </Text>
            </View>
          </View>
        ))}
      </View>
      <Text style={type.small}>
        Any other field is refused (unknown_field), so a misspelt name never passes unnoticed.
      </Text>
      <Text style={type.body} testID="token-interval">
        Post every {RECOMMENDED_INTERVAL_S.min / 60}–{RECOMMENDED_INTERVAL_S.max / 60} minutes.
        Drybench learns the interval from the readings; after {SILENT_AFTER_INTERVALS} intervals
        without one (at least {fallback.silentAfterS / 60} min) the sensor counts as silent. You can
        set the interval on the sensor below.
      </Text>

      <Text style={type.label} role="heading" aria-level={3}>
        Try it: post a first reading
      </Text>
      <Text selectable style={styles.code} testID="sensor-curl">
        {command}
      </Text>
      {mqttUrl ? (
        <>
          <Text style={type.small}>Or over MQTT:</Text>
          <Text selectable style={styles.code} testID="sensor-mqtt-command">
            {mqttPublishExample(mqttUrl, sensorId, token, unit)}
          </Text>
        </>
      ) : null}
      <FirstReading shopId={shopId} sensorId={sensorId} timeZone={timeZone} unit={unit} />
      <Button
        label="Done, the sensor has it"
        variant="quiet"
        onPress={onDone}
        testID="token-done"
      />
    </Panel>
  );
}

interface FirstReadingProps {
  shopId: string;
  sensorId: string;
  timeZone: string;
  unit: TemperatureUnit;
}

/**
 * Waits for the sensor's next reading. The live socket's reading message moves the sensor's
 * "last seen" in the query cache (components/live), so this needs no socket of its own.
 */
function FirstReading({ shopId, sensorId, timeZone, unit }: FirstReadingProps) {
  const now = useNow(5_000);
  const sensors = useSensorsQuery(shopId);
  const zones = useZonesQuery(shopId);
  const sensor = sensors.data?.sensors.find((s) => s.id === sensorId);
  // What it had when the token was shown: a rotated sensor has readings already.
  const [seenBefore, setSeenBefore] = useState<string | null | undefined>(undefined);
  if (seenBefore === undefined && sensors.data) setSeenBefore(sensor?.lastSeenAt ?? null);
  const arrived =
    seenBefore !== undefined && sensor?.lastSeenAt != null && sensor.lastSeenAt !== seenBefore;
  const zone = zones.data?.zones.find((z) => z.id === sensor?.zoneId);
  const latest = zone?.latest?.sensorId === sensorId ? zone.latest : null;

  return (
    <View
      style={[styles.first, arrived && styles.firstArrived]}
      role="status"
      aria-live="polite"
      testID="first-reading"
    >
      <Text style={[type.body, arrived && styles.firstText]}>
        {arrived && sensor?.lastSeenAt
          ? firstReadingText(formatLastSeen(sensor.lastSeenAt, now, timeZone))
          : 'Waiting for the first reading…'}
      </Text>
      {arrived && latest && zone ? (
        <Text style={type.small} testID="first-reading-level">
          {zone.name}: {levelWordInline(latest.level)}, dew margin{' '}
          {formatMargin(latest.margin, unit)}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  code: codeStyle,
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  fields: { gap: space.sm },
  field: { flexDirection: 'row', gap: space.md, alignItems: 'flex-start' },
  fieldName: { fontFamily: fonts.bold, fontSize: 13, lineHeight: 20, color: colors.ink, width: 64 },
  fieldText: { flex: 1, gap: 2 },
  first: {
    borderColor: colors.border,
    borderWidth: 1,
    borderRadius: radius.control,
    padding: space.md,
    gap: 2,
  },
  firstArrived: { borderColor: colors.dry, borderLeftWidth: 5 },
  firstText: { fontFamily: fonts.medium, color: colors.dry },
});
