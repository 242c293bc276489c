/**
 * Words about the two ways a sensor sends readings (HTTP and MQTT), shown on the Sensors page
 * and with a new token. The command line is generic MQTT usage (the common command-line
 * publisher's flags: -h host, -p port, -i client id, -u username, -P password, -t topic,
 * -q QoS, -m message); any MQTT 3.1.1 client takes the same settings.
 */
import { acksTopic, MQTT_DEFAULT_PORT, MQTTS_DEFAULT_PORT, readingsTopic } from '../mqttTopics';
import type { TemperatureUnit } from '../units';

import { exampleReadingJson } from './sensors';

export const WAYS_IN_TITLE = 'How sensors send readings';

export const WAYS_IN_HINT =
  'Over HTTP or over MQTT: the same readings, checks and answers either way.';

export const HTTP_WAY_TEXT =
  'HTTP: POST the readings as JSON to /api/v1/ingest with the token as a Bearer token. The answer says what was stored.';

export const MQTT_WAY_TEXT =
  'MQTT: connect with the sensor id as username and its token as password (client id: the sensor id), then publish the same JSON with QoS 1 to the sensor’s readings topic. The acknowledgement comes once the readings are stored; the answer is published on its acks topic.';

export const MQTT_OFF_TEXT = 'MQTT is off on this server: sensors send readings over HTTP.';

export const MQTT_BROKER_LABEL = 'MQTT broker';
export const MQTT_TOPIC_LABEL = 'Readings topic';
export const MQTT_ACKS_LABEL = 'Answers on';

/** Host and port of a broker URL such as mqtt://shop.example:1883 (the standard port if none). */
export function brokerHostPort(url: string): { host: string; port: number; tls: boolean } {
  const match = /^(mqtts?):\/\/(\[[^\]]+\]|[^:/]+)(?::(\d+))?/.exec(url);
  const tls = match?.[1] === 'mqtts';
  const port = match?.[3] ? Number(match[3]) : tls ? MQTTS_DEFAULT_PORT : MQTT_DEFAULT_PORT;
  return { host: match?.[2] ?? url, port, tls };
}

/** A command line that publishes one reading, in the reader's unit. */
export function mqttPublishExample(
  brokerUrl: string,
  sensorId: string,
  token: string,
  unit: TemperatureUnit = 'C',
): string {
  const { host, port, tls } = brokerHostPort(brokerUrl);
  return [
    `mosquitto_pub -h ${host} -p ${port}${tls ? ' --capath /etc/ssl/certs' : ''} \\`,
    `  -i ${sensorId} -u ${sensorId} -P '${token}' -q 1 \\`,
    `  -t ${readingsTopic(sensorId)} \\`,
    `  -m '${exampleReadingJson(unit)}'`,
  ].join('\n');
}

export { acksTopic as mqttAcksTopic, readingsTopic as mqttReadingsTopic };
