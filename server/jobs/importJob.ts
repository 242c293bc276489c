/**
 * CSV imports as pg-boss jobs. The start route's transaction that marks an import queued also
 * inserts its job (pg-boss's `db` option on the transaction's own connection), so a queued
 * import always has a job and a job never names an import that was not queued. The job id is
 * the import's id. An import runs whole in one transaction (server/imports/run.ts), so a worker
 * that dies mid-way leaves nothing behind, and the retry starts the file again.
 */
import type PgBoss from 'pg-boss';

import type { Db } from '@/db';

import { expireStaleUploads, type ExpireUploadsDeps } from '../imports/expire';
import { runImport, type ImportRunDeps } from '../imports/run';

import { transactionClient } from './alarmMailJob';
import { scheduleSingletonJob } from './singletonJob';

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
      // Fair between shops: a job's priority is minus its shop's imports already queued or
      // running, and workers take the highest priority first, so one shop's pile of files
      // never stands in front of another shop's first one.
      const { rows } = await client.query<{ ahead: number }>(
        `select count(*)::int as ahead from imports
         where shop_id = (select shop_id from imports where id = $1)
           and status in ('queued', 'running') and id <> $1`,
        [importId],
      );
      const priority = -(rows[0]?.ahead ?? 0);
      const id = await boss.send(IMPORT_QUEUE, { importId }, { id: importId, db, priority });
      if (id === null) throw new Error('import: no job queued (is the queue missing?)');
    },
  };
}

export interface ImportWorkerOptions extends ImportRunDeps {
  /**
   * How often an idle worker asks for a job: 0.5 s (pg-boss's least; its default is 2 s), as a
   * started import is someone waiting at a progress bar, and the poll is one indexed query.
   */
  pollingIntervalSeconds?: number;
}

/**
 * Imports this instance works at once. Two, so a shop's big file leaves a worker for another
 * shop's import (the priorities above put that one first); not more, as each import holds its
 * file's rows in memory (a 500,000-line file ~100 MB at its peak).
 */
export const IMPORT_WORKERS = 2;

/** Works the queue on this instance: `IMPORT_WORKERS` workers, one import each at a time. */
export async function workImports(boss: PgBoss, options: ImportWorkerOptions): Promise<string[]> {
  await createImportQueue(boss);
  const workers: string[] = [];
  for (let i = 0; i < IMPORT_WORKERS; i++) {
    workers.push(
      await boss.work<{ importId?: unknown }>(
        IMPORT_QUEUE,
        { pollingIntervalSeconds: options.pollingIntervalSeconds ?? 0.5, batchSize: 1 },
        async (jobs) => {
          for (const job of jobs) {
            const importId = job.data?.importId;
            if (typeof importId === 'string') await runImport(options, importId);
          }
        },
      ),
    );
  }
  return workers;
}

export const IMPORT_EXPIRY_QUEUE = 'import-upload-expiry';
/** Hourly, off the hour's top: an upload is let go within an hour after its keep time. */
export const IMPORT_EXPIRY_CRON = '23 * * * *';

/** Schedules the hourly expiry of uploads never started and works it on this instance. */
export async function scheduleUploadExpiry(
  boss: PgBoss,
  options: ExpireUploadsDeps & { now?: () => number; pollingIntervalSeconds?: number },
): Promise<void> {
  const now = options.now ?? Date.now;
  const log = options.logger.child({ component: 'jobs' });
  await scheduleSingletonJob(
    boss,
    {
      queue: IMPORT_EXPIRY_QUEUE,
      cron: IMPORT_EXPIRY_CRON,
      // Not retried: the next hour's run finds the same rows.
      retryLimit: 0,
      expireInSeconds: 10 * 60,
      pollingIntervalSeconds: options.pollingIntervalSeconds,
    },
    async () => {
      const count = await expireStaleUploads(options, now());
      if (count > 0) log.info({ count }, 'import: uploads never started were let go');
    },
  );
}
