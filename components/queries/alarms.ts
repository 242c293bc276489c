/**
 * A shop's alarms: GET /api/v1/shops/:shopId/alarms?state=open|all and POST …/alarms/:id/ack.
 * Live `alarm` messages and acknowledgements patch the cached lists through the same keys.
 */
import {
  queryOptions,
  useMutation,
  useQuery,
  useQueryClient,
  type QueryClient,
} from '@tanstack/react-query';

import type { Alarm, AlarmAckResponse, AlarmsResponse } from '@/ingest/wire/alarms';

import { apiRequest, isApiError } from './api';
import { patchCached } from './livePatch';
import { shopPath } from './shops';

// The shapes are the server's own (ingest/wire/alarms.ts); screens import them from here.
export type {
  Alarm,
  AlarmAcknowledgement,
  AlarmAckResponse,
  AlarmKind,
  AlarmsResponse,
  AlarmValues,
} from '@/ingest/wire/alarms';
export type AlarmListState = 'open' | 'all';

export const alarmKeys = {
  all: ['alarms'] as const,
  shop: (shopId: string) => [...alarmKeys.all, shopId] as const,
  list: (shopId: string, state: AlarmListState) => [...alarmKeys.shop(shopId), state] as const,
};

export function alarmsQueryOptions(shopId: string, state: AlarmListState = 'open') {
  return queryOptions({
    queryKey: alarmKeys.list(shopId, state),
    queryFn: ({ signal }) =>
      apiRequest<AlarmsResponse>(`${shopPath(shopId)}/alarms?state=${state}`, { signal }),
    // Live messages keep the lists fresh; a refetch on focus catches anything missed.
    staleTime: 30_000,
  });
}

export function useAlarmsQuery(shopId: string, state: AlarmListState = 'open') {
  return useQuery(alarmsQueryOptions(shopId, state));
}

/** How far along an alarm's life a version is: a later change, then an ack, then a clear. */
function progress(alarm: Alarm): [number, number, number] {
  return [Date.parse(alarm.updatedAt), alarm.acknowledgement ? 1 : 0, alarm.clearedAt ? 1 : 0];
}

function isOlder(a: Alarm, b: Alarm): boolean {
  const [pa, pb] = [progress(a), progress(b)];
  for (let i = 0; i < pa.length; i++) if (pa[i] !== pb[i]) return pa[i]! < pb[i]!;
  return false;
}

/** Open alarms first, then the newest: the server's order. */
function byServerOrder(a: Alarm, b: Alarm): number {
  if ((a.state === 'open') !== (b.state === 'open')) return a.state === 'open' ? -1 : 1;
  return Date.parse(b.openedAt) - Date.parse(a.openedAt);
}

/**
 * A list with one alarm as it now stands. An older version never replaces a newer one (a live
 * message may arrive after the answer to an acknowledgement); the open list drops cleared ones.
 */
export function withAlarm(
  response: AlarmsResponse,
  alarm: Alarm,
  state: AlarmListState,
): AlarmsResponse {
  const known = response.alarms.find((a) => a.id === alarm.id);
  if (known && !isOlder(known, alarm)) return response;
  const others = response.alarms.filter((a) => a.id !== alarm.id);
  const keep = state === 'all' || alarm.state === 'open';
  return { ...response, alarms: (keep ? [...others, alarm] : others).sort(byServerOrder) };
}

/** Puts an alarm into every cached list of its shop. */
export function patchAlarm(queryClient: QueryClient, shopId: string, alarm: Alarm): void {
  for (const state of ['open', 'all'] as const) {
    patchCached<AlarmsResponse>(queryClient, alarmKeys.list(shopId, state), (previous) =>
      withAlarm(previous, alarm, state),
    );
  }
}

export interface AlarmAckInput {
  alarmId: string;
  note: string;
}

export function useAlarmAckMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ alarmId, note }: AlarmAckInput) =>
      apiRequest<AlarmAckResponse>(
        `${shopPath(shopId)}/alarms/${encodeURIComponent(alarmId)}/ack`,
        { method: 'POST', body: { note } },
      ),
    onSuccess: ({ alarm }) => patchAlarm(queryClient, shopId, alarm),
    onError: (error) => {
      // Someone else was quicker: show their acknowledgement.
      if (isApiError(error, 409)) {
        void queryClient.invalidateQueries({ queryKey: alarmKeys.shop(shopId) });
      }
    },
  });
}
