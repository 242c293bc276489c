/**
 * The MQTT topics of the sensor contract (shared/API.md): a sensor publishes the ingest body to
 * `drybench/<sensorId>/readings` and hears the answer on `drybench/<sensorId>/acks`. Shared by
 * the broker (topic rights), the server (its subscription), the simulator and the Sensors page.
 */

export const MQTT_TOPIC_ROOT = 'drybench';

/** The server's subscription: every sensor's readings topic. */
export const READINGS_FILTER = `${MQTT_TOPIC_ROOT}/+/readings`;

/** The username the server's own connections use; sensors use their sensor id. */
export const MQTT_SERVICE_USERNAME = 'drybench-server';

/** The standard MQTT port, and MQTT over TLS's, for addresses written without one. */
export const MQTT_DEFAULT_PORT = 1883;
export const MQTTS_DEFAULT_PORT = 8883;

export function readingsTopic(sensorId: string): string {
  return `${MQTT_TOPIC_ROOT}/${sensorId}/readings`;
}

export function acksTopic(sensorId: string): string {
  return `${MQTT_TOPIC_ROOT}/${sensorId}/acks`;
}

/** The sensor id of a readings topic, or null for any other topic (wildcards included). */
export function sensorOfReadingsTopic(topic: string): string | null {
  const parts = topic.split('/');
  if (parts.length !== 3 || parts[0] !== MQTT_TOPIC_ROOT || parts[2] !== 'readings') return null;
  const id = parts[1]!;
  return id.length > 0 && !/[+#]/.test(id) ? id : null;
}

/** The sensor id of an acks topic, or null for any other topic (wildcards included). */
export function sensorOfAcksTopic(topic: string): string | null {
  const parts = topic.split('/');
  if (parts.length !== 3 || parts[0] !== MQTT_TOPIC_ROOT || parts[2] !== 'acks') return null;
  const id = parts[1]!;
  return id.length > 0 && !/[+#]/.test(id) ? id : null;
}

/**
 * A sensor's MQTT client id must start with its sensor id: a broker drops the older connection
 * of a client id that connects twice, so a free choice would let one sensor knock another (or
 * the server) off.
 */
export function sensorClientIdAllowed(sensorId: string, clientId: string): boolean {
  return clientId === sensorId || clientId.startsWith(`${sensorId}-`);
}
