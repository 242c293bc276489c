/** Sensor rows to what the API answers (ingest/wire/sensors.ts): the one place that decides it. */
import type { listSensors } from '@/db/queries/sensors';
import type { CreatedSensor, Sensor, SensorPlacement } from '@/ingest/wire';

type SensorRow = Awaited<ReturnType<typeof listSensors>>[number];

const isoOrNull = (at: Date | null) => (at === null ? null : at.toISOString());

export function toSensor(row: SensorRow): Sensor {
  return {
    id: row.id,
    name: row.name,
    zoneId: row.zoneId,
    zoneName: row.zoneName,
    lastSeenAt: isoOrNull(row.lastSeenAt),
    batteryV: row.batteryV,
    revokedAt: isoOrNull(row.revokedAt),
    createdAt: row.createdAt.toISOString(),
  };
}

/** Never the token hash: only where the sensor sits. */
export function toSensorPlacement(row: SensorPlacement): SensorPlacement {
  return { id: row.id, name: row.name, zoneId: row.zoneId };
}

/** The only answer that carries a token: it is stored as a hash and never shown again. */
export function toCreatedSensor(row: SensorPlacement, token: string): CreatedSensor {
  return { ...toSensorPlacement(row), token };
}
