/** A shop's sensors: GET, POST and PATCH /shops/:shopId/sensors, POST …/sensors/:id/token. */

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
}

export interface SensorsResponse {
  sensors: Sensor[];
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
