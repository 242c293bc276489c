/** Import rows to what the API and the live socket send (ingest/wire/imports.ts). */
import type { ImportRow } from '@/db/queries/imports';
import type { Import, ImportMessage } from '@/ingest/wire/imports';

const iso = (d: Date | null) => (d === null ? null : d.toISOString());

export function toImport(row: ImportRow): Import {
  return {
    id: row.id,
    sensorId: row.sensorId,
    fileName: row.fileName,
    bytes: row.bytes,
    status: row.status,
    rowsRead: row.rowsRead,
    rowsStored: row.rowsStored,
    rowsDuplicate: row.rowsDuplicate,
    rowsRejected: row.rowsRejected,
    firstAt: iso(row.firstAt),
    lastAt: iso(row.lastAt),
    error: row.errorCode === null ? null : { code: row.errorCode, message: row.errorMessage ?? '' },
    createdAt: row.createdAt.toISOString(),
    finishedAt: iso(row.finishedAt),
  };
}

/** The live message of an import as it stands; a few hundred bytes, far below pg_notify's cap. */
export function importMessageJson(row: ImportRow): string {
  // A file name is the person's own; cut it so the message stays small whatever they called it.
  const cut = { ...row, fileName: row.fileName.slice(0, 200) };
  return JSON.stringify({
    type: 'import',
    shopId: row.shopId,
    import: toImport(cut),
  } satisfies ImportMessage);
}
