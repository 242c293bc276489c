/** A shop's sensors: list (last seen, battery), create, rotate, revoke, move, remove. */
import {
  queryOptions,
  useMutation,
  useQuery,
  useQueryClient,
  type QueryClient,
} from '@tanstack/react-query';

import type {
  CreatedSensor,
  IssuedToken,
  Sensor,
  SensorPlacement,
  SensorsResponse,
} from '@/ingest/wire';

import { apiRequest } from './api';
import { patchCached } from './livePatch';
import { shopPath } from './shops';
import { zoneKeys } from './zones';

// The shapes the server answers have one home; screens keep importing them from here.
export type { CreatedSensor, IssuedToken, Sensor, SensorPlacement, SensorsResponse };

export const sensorKeys = {
  all: ['sensors'] as const,
  list: (shopId: string) => [...sensorKeys.all, shopId, 'list'] as const,
};

export function sensorsQueryOptions(shopId: string) {
  return queryOptions({
    queryKey: sensorKeys.list(shopId),
    queryFn: ({ signal }) => apiRequest<SensorsResponse>(`${shopPath(shopId)}/sensors`, { signal }),
    // Last seen and battery change with every reading: fresh on each visit, and every
    // 30 s while the page is open (live messages carry readings, not sensor rows).
    staleTime: 0,
    refetchInterval: 30_000,
  });
}

export function useSensorsQuery(shopId: string) {
  return useQuery(sensorsQueryOptions(shopId));
}

function useSensorMutation<I, O>(shopId: string, fn: (input: I) => Promise<O>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: sensorKeys.list(shopId) });
      await queryClient.invalidateQueries({ queryKey: zoneKeys.shop(shopId) });
    },
  });
}

export function useSensorCreateMutation(shopId: string) {
  return useSensorMutation(shopId, (input: { name: string; zoneId: string }) =>
    apiRequest<CreatedSensor>(`${shopPath(shopId)}/sensors`, {
      method: 'POST',
      body: input,
    }),
  );
}

export function useSensorRotateMutation(shopId: string) {
  return useSensorMutation(shopId, (sensorId: string) =>
    apiRequest<IssuedToken>(`${shopPath(shopId)}/sensors/${encodeURIComponent(sensorId)}/token`, {
      method: 'POST',
    }),
  );
}

export function useSensorRevokeMutation(shopId: string) {
  return useSensorMutation(shopId, (sensorId: string) =>
    apiRequest<void>(`${shopPath(shopId)}/sensors/${encodeURIComponent(sensorId)}/token`, {
      method: 'DELETE',
    }),
  );
}

/** Removes a sensor from the shop; its readings stay in the zones' history. */
export function useSensorRemoveMutation(shopId: string) {
  return useSensorMutation(shopId, (sensorId: string) =>
    apiRequest<void>(`${shopPath(shopId)}/sensors/${encodeURIComponent(sensorId)}`, {
      method: 'DELETE',
    }),
  );
}

export function useSensorMoveMutation(shopId: string) {
  return useSensorMutation(shopId, (input: { sensorId: string; zoneId: string }) =>
    apiRequest<SensorPlacement>(
      `${shopPath(shopId)}/sensors/${encodeURIComponent(input.sensorId)}`,
      {
        method: 'PATCH',
        body: { zoneId: input.zoneId },
      },
    ),
  );
}

/** Sets how often the sensor posts (seconds), or clears it (null) so the learnt one applies. */
export function useSensorIntervalMutation(shopId: string) {
  return useSensorMutation(
    shopId,
    (input: { sensorId: string; expectedIntervalS: number | null }) =>
      apiRequest<Sensor>(`${shopPath(shopId)}/sensors/${encodeURIComponent(input.sensorId)}`, {
        method: 'PATCH',
        body: { expectedIntervalS: input.expectedIntervalS },
      }),
  );
}

/**
 * A live reading from a sensor moves its "last seen" in the list at once (the token screen's
 * "first reading received" waits on it); the rest of the row catches up on the next fetch.
 */
export function patchSensorSeen(
  queryClient: QueryClient,
  shopId: string,
  sensorId: string,
  atIso: string,
): void {
  patchCached<SensorsResponse>(queryClient, sensorKeys.list(shopId), (previous) => {
    let changed = false;
    const sensors = previous.sensors.map((sensor) => {
      if (sensor.id !== sensorId) return sensor;
      if (sensor.lastSeenAt && Date.parse(sensor.lastSeenAt) >= Date.parse(atIso)) return sensor;
      changed = true;
      return { ...sensor, lastSeenAt: atIso };
    });
    return changed ? { ...previous, sensors } : previous;
  });
}
