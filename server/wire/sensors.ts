/** Sensor rows to what the API answers (ingest/wire/sensors.ts): the one place that decides it. */
import type { listSensors } from '@/db/queries/sensors';
import { postingInterval } from '@/ingest';
import type { CreatedSensor, Sensor, SensorInterval, SensorPlacement } from '@/ingest/wire';

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
    interval: toSensorInterval(row),
  };
}

function toSensorInterval(row: SensorRow): SensorInterval {
  const { effectiveS, source, silentAfterS } = postingInterval(
    row.expectedIntervalS,
    row.intervalS,
  );
  return {
    setS: row.expectedIntervalS,
    // Learnt as a moving average: whole seconds are all a person or a sensor needs.
    learnedS: row.intervalS === null ? null : Math.round(row.intervalS),
    effectiveS: source === 'learned' ? Math.round(effectiveS) : effectiveS,
    source,
    silentAfterS: Math.round(silentAfterS),
    silentFrom:
      row.lastSeenAt === null
        ? null
        : new Date(row.lastSeenAt.getTime() + silentAfterS * 1000).toISOString(),
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
