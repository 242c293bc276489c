/**
 * Turns a sensor's parsed readings into rows to store: ingest/'s checks and air values, the
 * surface estimate where there is no probe, then ingest/'s margin and level (ingest/derive.ts).
 */
import type { ReadingRow } from '@/db/queries/readings';
import type { SensorIdentity } from '@/db/queries/sensors';
import {
  deriveAir,
  deriveMargin,
  type AirDerived,
  type Rejection,
  type SensorReading,
} from '@/ingest';

import type { SurfaceEstimator } from './surfaceEstimates';

export interface Prepared {
  /** In the order the sensor sent them, one per distinct `at`. */
  rows: ReadingRow[];
  rejected: ({ index: number } & Rejection)[];
}

export async function prepareReadings(
  sensor: SensorIdentity,
  readings: SensorReading[],
  receivedAtMs: number,
  estimator: SurfaceEstimator,
): Promise<Prepared> {
  const rejected: Prepared['rejected'] = [];
  const accepted: { reading: SensorReading; air: AirDerived }[] = [];
  const seenMs = new Set<number>();
  readings.forEach((reading, index) => {
    const verdict = deriveAir(reading, receivedAtMs);
    if (!verdict.ok) return void rejected.push({ index, ...verdict.rejection });
    // The same instant twice in one request is a duplicate too: keep the first.
    if (seenMs.has(reading.atMs)) return;
    seenMs.add(reading.atMs);
    accepted.push({ reading, air: verdict.air });
  });

  // The lag steps forward in time, so estimate over the readings sorted by time.
  const byTime = accepted.map((a) => a.reading).sort((a, b) => a.atMs - b.atMs);
  const estimates = new Map<number, number>();
  if (byTime.some((r) => r.surfaceC === null)) {
    const surfaces = await estimator.estimate(
      sensor.sensorId,
      byTime.map((r) => ({ atMs: r.atMs, airC: r.airC })),
    );
    byTime.forEach((r, i) => estimates.set(r.atMs, surfaces[i]!));
  }

  const limits = { cautionK: sensor.cautionK, wetK: sensor.wetK };
  const rows = accepted.map(({ reading, air }): ReadingRow => {
    const probe = reading.surfaceC !== null;
    const surfaceC = probe ? reading.surfaceC : (estimates.get(reading.atMs) ?? null);
    const at = new Date(reading.atMs);
    return {
      sensorId: sensor.sensorId,
      shopId: sensor.shopId,
      zoneId: sensor.zoneId,
      at,
      // Once here: the insert's array and the answer both send it.
      atIso: at.toISOString(),
      airC: reading.airC,
      rhPct: reading.rhPct,
      surfaceC,
      surfaceSource: probe ? 'probe' : surfaceC === null ? null : 'estimate',
      batteryV: reading.batteryV,
      ...deriveMargin(air, surfaceC, limits),
    };
  });
  return { rows, rejected };
}
