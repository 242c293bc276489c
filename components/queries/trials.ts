/**
 * A shop's protection trials: GET|POST …/trials, GET …/trials/:id, POST …/trials/:id/tests and
 * PUT …/trials/:id/tests/:testId/ranks. Every write refetches the trial, whose standings the
 * server computes.
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type { Trial, TrialTest, TrialTestKind, TrialsResponse } from '@/ingest/wire';

import { apiRequest } from './api';
import { fetchFile, type DownloadedFile, type FileFormat } from './files';
import { shopPath } from './shops';

// The shapes are the server's own (ingest/wire/trials.ts); screens import them from here.
export type {
  Trial,
  TrialPair,
  TrialStandings,
  TrialSummary,
  TrialTest,
  TrialTestKind,
  TrialTreatment,
  TrialsResponse,
} from '@/ingest/wire';

export const trialKeys = {
  all: ['trials'] as const,
  list: (shopId: string) => [...trialKeys.all, shopId, 'list'] as const,
  one: (shopId: string, trialId: string) => [...trialKeys.all, shopId, 'one', trialId] as const,
};

const trialsPath = (shopId: string) => `${shopPath(shopId)}/trials`;
const trialPath = (shopId: string, trialId: string) =>
  `${trialsPath(shopId)}/${encodeURIComponent(trialId)}`;

/** The trial as a CSV or PDF file (GET …/trials/:trialId?format=csv|pdf). */
export function fetchTrialFile(
  shopId: string,
  trialId: string,
  format: FileFormat,
): Promise<DownloadedFile> {
  return fetchFile(`${trialPath(shopId, trialId)}?format=${format}`, format);
}

export function trialsQueryOptions(shopId: string) {
  return queryOptions({
    queryKey: trialKeys.list(shopId),
    queryFn: ({ signal }) => apiRequest<TrialsResponse>(trialsPath(shopId), { signal }),
  });
}

export function useTrialsQuery(shopId: string) {
  return useQuery(trialsQueryOptions(shopId));
}

export function trialQueryOptions(shopId: string, trialId: string) {
  return queryOptions({
    queryKey: trialKeys.one(shopId, trialId),
    queryFn: ({ signal }) => apiRequest<Trial>(trialPath(shopId, trialId), { signal }),
  });
}

export function useTrialQuery(shopId: string, trialId: string) {
  return useQuery(trialQueryOptions(shopId, trialId));
}

export function useTrialCreateMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { name: string; treatments: string[] }) =>
      apiRequest<Trial>(trialsPath(shopId), { method: 'POST', body: input }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: trialKeys.list(shopId) }),
  });
}

export interface NewTrialTest {
  name: string;
  kind: TrialTestKind;
  from: string;
  to: string;
  /** The zone whose readings give the test's conditions. */
  zoneId?: string;
}

function useTrialMutation<I>(shopId: string, trialId: string, fn: (input: I) => Promise<unknown>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: trialKeys.one(shopId, trialId) });
      await queryClient.invalidateQueries({ queryKey: trialKeys.list(shopId) });
    },
  });
}

export function useTrialTestCreateMutation(shopId: string, trialId: string) {
  return useTrialMutation(shopId, trialId, (input: NewTrialTest) =>
    apiRequest<TrialTest>(`${trialPath(shopId, trialId)}/tests`, { method: 'POST', body: input }),
  );
}

export function useTrialRanksMutation(shopId: string, trialId: string) {
  return useTrialMutation(
    shopId,
    trialId,
    (input: { testId: string; ranks: { treatmentId: string; rank: number }[] }) =>
      apiRequest<TrialTest>(
        `${trialPath(shopId, trialId)}/tests/${encodeURIComponent(input.testId)}/ranks`,
        { method: 'PUT', body: { ranks: input.ranks } },
      ),
  );
}
