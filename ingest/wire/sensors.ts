/**
 * A shop's sensors: GET, POST and PATCH /shops/:shopId/sensors, POST …/sensors/:id/token. PATCH
 * answers the changed sensor as the list shows it.
 */

/**
 * How often a sensor posts and when it counts as silent (ingest/postingInterval.ts): the
 * interval its owner set, the one learnt from its readings, the one in force. Seconds.
 */
export interface SensorInterval {
  setS: number | null;
  learnedS: number | null;
  effectiveS: number;
  source: 'set' | 'learned' | 'default';
  /** Quiet for longer than this and it counts as silent. */
  silentAfterS: number;
  /** When it counts as silent if nothing arrives: last seen + silentAfterS; null before any. */
  silentFrom: string | null;
}

/** A sensor in the shop's list; never its token. Times ISO 8601, battery V. */
export interface Sensor {
  id: string;
  name: string;
  zoneId: string;
  zoneName: string;
  lastSeenAt: string | null;
  batteryV: number | null;
  revokedAt: string | null;
  createdAt: string;
  interval: SensorInterval;
}

export interface SensorsResponse {
  sensors: Sensor[];
  /** The MQTT broker sensors may publish to instead of POSTing; null when MQTT is off. */
  mqtt: { url: string } | null;
}

/** A sensor's name and zone, as a rename or move answers. */
export interface SensorPlacement {
  id: string;
  name: string;
  zoneId: string;
}

/** The one moment a token is visible: right after create or rotate (stored only as a hash). */
export interface IssuedToken {
  id: string;
  token: string;
}

/** What creating a sensor answers: where it sits and its token, this once. */
export interface CreatedSensor extends SensorPlacement, IssuedToken {}
