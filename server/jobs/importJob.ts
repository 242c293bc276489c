/**
 * CSV imports as pg-boss jobs. The start route's transaction that marks an import queued also
 * inserts its job (pg-boss's `db` option on the transaction's own connection), so a queued
 * import always has a job and a job never names an import that was not queued. The job id is
 * the import's id. An import runs whole in one transaction (server/imports/run.ts), so a worker
 * that dies mid-way leaves nothing behind, and the retry starts the file again.
 */
import type PgBoss from 'pg-boss';

import type { Db } from '@/db';

import { runImport, type ImportRunDeps } from '../imports/run';

import { transactionClient } from './alarmMailJob';

export const IMPORT_QUEUE = 'csv-import';

/** What the start route needs: queue an import's job inside its transaction. */
export interface ImportJobs {
  queue(tx: Db, importId: string): Promise<void>;
}

const QUEUE_OPTIONS = {
  name: IMPORT_QUEUE,
  policy: 'standard',
  // One retry, for a worker that died: the import row says why a failed one failed.
  retryLimit: 1,
  retryDelay: 30,
  // A 50 MB file is about a million lines: minutes on a busy machine, never half an hour.
  expireInSeconds: 30 * 60,
} as const;

export async function createImportQueue(boss: PgBoss): Promise<void> {
  await boss.createQueue(IMPORT_QUEUE, QUEUE_OPTIONS);
}

export function importJobs(boss: PgBoss): ImportJobs {
  return {
    async queue(tx, importId) {
      const client = transactionClient(tx);
      const db = { executeSql: (text: string, values: unknown[]) => client.query(text, values) };
      const id = await boss.send(IMPORT_QUEUE, { importId }, { id: importId, db });
      if (id === null) throw new Error('import: no job queued (is the queue missing?)');
    },
  };
}

export interface ImportWorkerOptions extends ImportRunDeps {
  /** How often an idle worker asks for a job; pg-boss's default is 2 s. */
  pollingIntervalSeconds?: number;
}

/** Works the queue on this instance, one import at a time (each holds its rows in memory). */
export async function workImports(boss: PgBoss, options: ImportWorkerOptions): Promise<string> {
  await createImportQueue(boss);
  return boss.work<{ importId?: unknown }>(
    IMPORT_QUEUE,
    { pollingIntervalSeconds: options.pollingIntervalSeconds ?? 2, batchSize: 1 },
    async (jobs) => {
      for (const job of jobs) {
        const importId = job.data?.importId;
        if (typeof importId === 'string') await runImport(options, importId);
      }
    },
  );
}
