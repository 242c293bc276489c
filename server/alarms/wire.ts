/** The one place an alarm row becomes the alarm the API answers and the live push carries. */
import type { AlarmViewRow } from '@/db/queries/alarms';
import type { Alarm } from '@/ingest/wire/alarms';

export function alarmOf(r: AlarmViewRow): Alarm {
  return {
    id: r.id,
    kind: r.kind,
    state: r.clearedAt ? 'cleared' : 'open',
    zone: { id: r.zoneId, name: r.zoneName },
    sensor: r.sensorId && r.sensorName ? { id: r.sensorId, name: r.sensorName } : null,
    sinceAt: r.sinceAt.toISOString(),
    openedAt: r.openedAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
    clearedAt: r.clearedAt?.toISOString() ?? null,
    worstMarginK: r.worstMarginK,
    latestMarginK: r.latestMarginK,
    minutesToWet: r.minutesToWet,
    peakRhPct: r.peakRhPct,
    latestRhPct: r.latestRhPct,
    lowestBatteryV: r.lowestBatteryV,
    latestBatteryV: r.latestBatteryV,
    acknowledgement: r.acknowledgedAt
      ? {
          by: r.acknowledgedBy ? { id: r.acknowledgedBy, name: r.acknowledgedByName ?? '' } : null,
          at: r.acknowledgedAt.toISOString(),
          note: r.ackNote ?? '',
        }
      : null,
  };
}
