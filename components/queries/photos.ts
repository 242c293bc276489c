/**
 * Photos of care entries and trial tests: upload (multipart, field `photo`) to the path that
 * names the subject, and delete. The photo lists come inside the surface and trial answers, so
 * both mutations refresh the query key the caller gives (the surface's or the trial's).
 */
import { useMutation, useQueryClient, type QueryKey } from '@tanstack/react-query';

import type { CreatedPhoto } from '@/ingest/wire';

import { apiRequest, apiUpload } from './api';
import { shopPath } from './shops';

// The shapes are the server's own (ingest/wire/photos.ts); screens import them from here.
export type { CreatedPhoto, Photo } from '@/ingest/wire';

const id = encodeURIComponent;

export const photoPaths = {
  careEntry: (shopId: string, surfaceId: string, entryId: string) =>
    `${shopPath(shopId)}/surfaces/${id(surfaceId)}/care/${id(entryId)}/photos`,
  trialTest: (shopId: string, trialId: string, testId: string) =>
    `${shopPath(shopId)}/trials/${id(trialId)}/tests/${id(testId)}/photos`,
  one: (shopId: string, photoId: string) => `${shopPath(shopId)}/photos/${id(photoId)}`,
};

/** POSTs one photo as the multipart field `photo` (413 too large, 415 not an image, 503 storage away). */
export function uploadPhoto(path: string, file: Blob, filename: string): Promise<CreatedPhoto> {
  return apiUpload<CreatedPhoto>(path, 'photo', file, filename);
}

export function usePhotoUploadMutation(path: string, refresh: QueryKey) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { file: Blob; filename: string }) =>
      uploadPhoto(path, input.file, input.filename),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: refresh }),
  });
}

export function usePhotoDeleteMutation(shopId: string, refresh: QueryKey) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (photoId: string) =>
      apiRequest<void>(photoPaths.one(shopId, photoId), { method: 'DELETE' }),
    // A photo already gone (404) is gone either way: refresh the list in both cases.
    onSettled: () => queryClient.invalidateQueries({ queryKey: refresh }),
  });
}
