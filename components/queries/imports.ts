/**
 * A sensor's CSV imports: upload (multipart, field `file`), start with the column choices,
 * cancel, the list of past imports, one import, and its rejected rows as CSV. The live socket's
 * `import` messages patch the same keys (patchImport); while an import runs its query also polls,
 * so a socket that is down only makes the bar move in steps.
 */
import {
  queryOptions,
  useMutation,
  useQuery,
  useQueryClient,
  type QueryClient,
} from '@tanstack/react-query';
import { useEffect } from 'react';

import type {
  Import,
  ImportAnswer,
  ImportStart,
  ImportStatus,
  ImportsResponse,
  ImportUploaded,
} from '@/ingest/wire';

import { apiRequest, apiUpload } from './api';
import { fetchFile, type DownloadedFile } from './files';
import { shopPath } from './shops';

// The shapes are the server's own (ingest/wire/imports.ts); screens import them from here.
export type {
  Import,
  ImportAnswer,
  ImportMapping,
  ImportPreview,
  ImportStart,
  ImportStatus,
  ImportsResponse,
  ImportTimeFormat,
  ImportUploaded,
} from '@/ingest/wire';

const id = encodeURIComponent;

export const importPaths = {
  list: (shopId: string, sensorId: string) => `${shopPath(shopId)}/sensors/${id(sensorId)}/imports`,
  one: (shopId: string, sensorId: string, importId: string) =>
    `${importPaths.list(shopId, sensorId)}/${id(importId)}`,
};

export const importKeys = {
  all: ['imports'] as const,
  sensor: (shopId: string, sensorId: string) => [...importKeys.all, shopId, sensorId] as const,
  list: (shopId: string, sensorId: string) =>
    [...importKeys.sensor(shopId, sensorId), 'list'] as const,
  one: (shopId: string, sensorId: string, importId: string) =>
    [...importKeys.sensor(shopId, sensorId), 'one', importId] as const,
};

/** Statuses an import still moves on from; while in one, its query polls. */
const MOVING: readonly ImportStatus[] = ['queued', 'running'];

export function isImportMoving(status: ImportStatus): boolean {
  return MOVING.includes(status);
}

/**
 * How often a moving import is asked for by HTTP: rarely while the live socket carries its
 * progress (a lost message is made good soon), every 2 s when it does not.
 */
export function importPollMs(status: ImportStatus, liveOpen: boolean): number | false {
  if (!isImportMoving(status)) return false;
  return liveOpen ? 15_000 : 2_000;
}

export function importsQueryOptions(shopId: string, sensorId: string) {
  return queryOptions({
    queryKey: importKeys.list(shopId, sensorId),
    queryFn: ({ signal }) =>
      apiRequest<ImportsResponse>(importPaths.list(shopId, sensorId), { signal }),
  });
}

export function useImportsQuery(shopId: string, sensorId: string) {
  return useQuery(importsQueryOptions(shopId, sensorId));
}

export function importQueryOptions(shopId: string, sensorId: string, importId: string) {
  return queryOptions({
    queryKey: importKeys.one(shopId, sensorId, importId),
    queryFn: ({ signal }) =>
      apiRequest<ImportAnswer>(importPaths.one(shopId, sensorId, importId), { signal }),
  });
}

export function useImportQuery(
  shopId: string,
  sensorId: string,
  importId: string,
  liveOpen: boolean,
) {
  const queryClient = useQueryClient();
  const query = useQuery({
    ...importQueryOptions(shopId, sensorId, importId),
    refetchInterval: (query) => {
      const status = query.state.data?.import.status;
      return status ? importPollMs(status, liveOpen) : false;
    },
  });
  // A poll's answer is news for the list of past imports too (the socket patches both itself).
  const fetched = query.data?.import;
  useEffect(() => {
    if (fetched) patchImportList(queryClient, shopId, fetched);
  }, [queryClient, shopId, fetched]);
  return query;
}

/**
 * POSTs the logger's file as the multipart field `file`. Refusals come back as the server's own
 * ApiError (413 too large; 400 empty, binary, no header, one column).
 */
export function uploadImportFile(
  shopId: string,
  sensorId: string,
  file: Blob,
  fileName: string,
): Promise<ImportUploaded> {
  return apiUpload<ImportUploaded>(importPaths.list(shopId, sensorId), 'file', file, fileName);
}

function useImportMutation<I, O extends ImportUploaded | ImportAnswer>(
  shopId: string,
  sensorId: string,
  fn: (input: I) => Promise<O>,
) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: (answer) => patchImport(queryClient, shopId, answer.import),
    onSettled: () => queryClient.invalidateQueries({ queryKey: importKeys.list(shopId, sensorId) }),
  });
}

export function useImportUploadMutation(shopId: string, sensorId: string) {
  return useImportMutation(shopId, sensorId, (input: { file: Blob; fileName: string }) =>
    uploadImportFile(shopId, sensorId, input.file, input.fileName),
  );
}

export function useImportStartMutation(shopId: string, sensorId: string) {
  return useImportMutation(shopId, sensorId, (input: { importId: string } & ImportStart) =>
    apiRequest<ImportAnswer>(`${importPaths.one(shopId, sensorId, input.importId)}/start`, {
      method: 'POST',
      body: { mapping: input.mapping, remember: input.remember },
    }),
  );
}

export function useImportCancelMutation(shopId: string, sensorId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (importId: string) =>
      apiRequest<ImportAnswer>(`${importPaths.one(shopId, sensorId, importId)}/cancel`, {
        method: 'POST',
      }),
    onSuccess: (answer) => patchImport(queryClient, shopId, answer.import),
    // 409 import_finished: it ended first; read where it stands.
    onSettled: (_answer, _error, importId) =>
      queryClient.invalidateQueries({ queryKey: importKeys.sensor(shopId, sensorId) }).then(() =>
        queryClient.invalidateQueries({
          queryKey: importKeys.one(shopId, sensorId, importId),
        }),
      ),
  });
}

/** The rows the import could not read, as the server's CSV (line, reason, row). */
export function fetchRejectedRows(
  shopId: string,
  sensorId: string,
  importId: string,
): Promise<DownloadedFile> {
  return fetchFile(`${importPaths.one(shopId, sensorId, importId)}/rejected.csv`, 'csv');
}

/** The first rejected rows as text, for the list under the summary. */
export function useRejectedRowsQuery(
  shopId: string,
  sensorId: string,
  importId: string,
  enabled: boolean,
) {
  return useQuery({
    queryKey: [...importKeys.one(shopId, sensorId, importId), 'rejected'] as const,
    queryFn: async () => (await fetchRejectedRows(shopId, sensorId, importId)).blob.text(),
    enabled,
    staleTime: Infinity,
  });
}

const STATUS_ORDER: Record<ImportStatus, number> = {
  uploaded: 0,
  queued: 1,
  running: 2,
  done: 3,
  failed: 3,
  cancelled: 3,
};

/**
 * Whether `next` may replace `held`: a poll answer and a live message can cross, so a status
 * never steps back and, within one status, the counts never go down.
 */
export function isImportNewer(held: Import, next: Import): boolean {
  const step = STATUS_ORDER[next.status] - STATUS_ORDER[held.status];
  if (step !== 0) return step > 0;
  return next.rowsRead >= held.rowsRead;
}

/** An import as it now stands (a live message, an answer) into the one and the list queries. */
export function patchImport(queryClient: QueryClient, shopId: string, next: Import): void {
  queryClient.setQueryData<ImportAnswer>(
    importKeys.one(shopId, next.sensorId, next.id),
    (previous) => (previous && !isImportNewer(previous.import, next) ? previous : { import: next }),
  );
  patchImportList(queryClient, shopId, next);
}

/** An import as it now stands into its sensor's list, when the list is loaded. */
export function patchImportList(queryClient: QueryClient, shopId: string, next: Import): void {
  queryClient.setQueryData<ImportsResponse>(importKeys.list(shopId, next.sensorId), (previous) => {
    if (!previous) return previous;
    const at = previous.imports.findIndex((held) => held.id === next.id);
    if (at === -1) return { imports: [next, ...previous.imports] };
    if (!isImportNewer(previous.imports[at]!, next)) return previous;
    const imports = [...previous.imports];
    imports[at] = next;
    return { imports };
  });
}
