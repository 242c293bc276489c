/** Photo rows to what the API answers (ingest/wire/photos.ts). */
import type { PhotoRow } from '@/db/queries/photos';
import type { Photo } from '@/ingest/wire/photos';

export function toPhoto(
  row: Pick<PhotoRow, 'id' | 'shopId' | 'widthPx' | 'heightPx' | 'createdBy'>,
): Photo {
  const url = `/api/v1/shops/${row.shopId}/photos/${row.id}`;
  return {
    id: row.id,
    url,
    thumbUrl: `${url}/thumb`,
    widthPx: row.widthPx,
    heightPx: row.heightPx,
    addedById: row.createdBy,
  };
}

/** A subject's photos by its id, in the order the rows came (oldest first). */
export function photosBySubject(rows: readonly PhotoRow[]): Map<string, Photo[]> {
  const out = new Map<string, Photo[]>();
  for (const row of rows) {
    if (!row.ownerId) continue;
    const list = out.get(row.ownerId) ?? [];
    list.push(toPhoto(row));
    out.set(row.ownerId, list);
  }
  return out;
}
