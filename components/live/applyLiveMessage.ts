/**
 * Live messages change server state only through the query cache and its key factories; the
 * live client keeps no copy of its own.
 */
import type { QueryClient } from '@tanstack/react-query';

import {
  alarmKeys,
  appendReadingPoint,
  importKeys,
  invalidateZoneExposures,
  meKeys,
  patchAlarm,
  patchImport,
  patchSensorSeen,
  patchZoneLatest,
  readingKeys,
  sensorKeys,
  zoneKeys,
  type ImportAnswer,
} from '@/components/queries';

import type { LiveMessage } from './messages';

export function applyLiveMessage(queryClient: QueryClient, message: LiveMessage): void {
  switch (message.type) {
    case 'reading': {
      const { shopId, zoneId, sensorId, reading } = message;
      patchZoneLatest(queryClient, shopId, zoneId, { ...reading, sensorId });
      patchSensorSeen(queryClient, shopId, sensorId, reading.at);
      // The server sums a surface's exposure from stored readings: read it again.
      invalidateZoneExposures(queryClient, shopId, zoneId);
      if ((message.count ?? 1) > 1) {
        // A batch (a sensor catching up) carries only its newest reading: refetch the series.
        void queryClient.invalidateQueries({ queryKey: readingKeys.zone(shopId, zoneId) });
        return;
      }
      appendReadingPoint(queryClient, shopId, zoneId, {
        at: reading.at,
        air: reading.air,
        rh: reading.rh,
        surface: reading.surface,
        dewPoint: reading.dewPoint,
        margin: reading.margin,
        marginMin: reading.margin,
        marginMax: reading.margin,
        emc: reading.emc,
        level: reading.level,
        count: 1,
      });
      return;
    }
    case 'alarm': {
      if (message.partial) {
        void queryClient.invalidateQueries({ queryKey: alarmKeys.shop(message.shopId) });
        return;
      }
      patchAlarm(queryClient, message.shopId, message.alarm);
      return;
    }
    case 'zones': {
      // Another tab (or person) added, renamed, changed or deleted a zone: read the list again.
      void queryClient.invalidateQueries({ queryKey: zoneKeys.shop(message.shopId) });
      return;
    }
    case 'sensors': {
      void queryClient.invalidateQueries({ queryKey: sensorKeys.list(message.shopId) });
      return;
    }
    case 'import': {
      const held = queryClient.getQueryData<ImportAnswer>(
        importKeys.one(message.shopId, message.import.sensorId, message.import.id),
      );
      patchImport(queryClient, message.shopId, message.import);
      // A finished import's readings are stored now: charts and cards read them again, once.
      if (message.import.status === 'done' && held?.import.status !== 'done') {
        void queryClient.invalidateQueries({ queryKey: readingKeys.all });
        void queryClient.invalidateQueries({ queryKey: zoneKeys.shop(message.shopId) });
      }
      return;
    }
    case 'access': {
      // The shop list and roles live in /me; a shop no longer listed shows "not found".
      void queryClient.invalidateQueries({ queryKey: meKeys.all });
      return;
    }
  }
}
