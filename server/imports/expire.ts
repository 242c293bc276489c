/**
 * Uploaded files that nobody started: a person who uploads and walks away leaves a file in
 * object storage and an import row waiting. After `UPLOAD_KEEP_MS` the import is cancelled
 * with its reason (shown in the sensor's import list) and the file is deleted.
 */
import type pg from 'pg';

import { expireUploads } from '@/db/queries/imports';
import { IMPORT_ERRORS } from '@/ingest/words/importReasons';

import type { Logger } from '../logger';
import type { Storage } from '../storage';

/** A day: long enough to come back after a break to pick the columns, short for storage. */
export const UPLOAD_KEEP_MS = 24 * 3_600_000;

export interface ExpireUploadsDeps {
  pool: pg.Pool;
  storage: Storage;
  logger: Logger;
}

/** Cancels the uploads older than the keep time at `nowMs` and deletes their files. */
export async function expireStaleUploads(deps: ExpireUploadsDeps, nowMs: number): Promise<number> {
  const expired = await expireUploads(deps.pool, new Date(nowMs - UPLOAD_KEEP_MS), {
    code: 'upload_expired',
    message: IMPORT_ERRORS.upload_expired(UPLOAD_KEEP_MS / 3_600_000),
  });
  for (const row of expired) {
    // A file that cannot be deleted now stays behind: the row no longer names it as waiting,
    // and storage's own lifecycle rules (if any) are the backstop. Logged so it can be found.
    await deps.storage
      .delete(row.objectKey)
      .catch((err: unknown) =>
        deps.logger.warn({ err, importId: row.id }, 'import: an expired upload was not deleted'),
      );
  }
  return expired.length;
}
