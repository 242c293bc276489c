// CSV import tests: a real S3 fake for the files, pg-boss (its own schema per test file) queuing
// and working the import jobs, and the app listening on loopback with its live hub, so uploads
// go over real HTTP and progress arrives on a real WebSocket.
import http from 'node:http';
import type { AddressInfo } from 'node:net';

import type PgBoss from 'pg-boss';
import type request from 'supertest';

import {
  createImportQueue,
  importJobs,
  startJobRunner,
  workImports,
  type ImportJobs,
  type ImportWorkerOptions,
} from '@/server/jobs';
import { startLiveHub } from '@/server/live/hub';
import { silentLogger } from '@/server/logger';
import { createS3Storage, type StorageConfig } from '@/server/storage';
import type { Import, ImportMapping } from '@/ingest/wire/imports';

import { makeTestApp, type TestApp } from './app';
import { startS3Fake, type S3Fake } from './s3';

/**
 * The import jobs as `npm start` runs them: the files in an S3 fake, the jobs queued in pg-boss
 * (its own schema, so test files running side by side do not take each other's jobs) and worked
 * by the server's own job. `appOptions` go to the app; `work` starts the worker over its database.
 */
export interface ImportJobRunner {
  s3: S3Fake;
  boss: PgBoss;
  appOptions: { storage: StorageConfig; imports: ImportJobs };
  /** Starts working the queue once (some tests look at a queued import first). */
  work(app: Pick<ImportWorkerOptions, 'db' | 'pool' | 'logger'>): Promise<void>;
  close(): Promise<void>;
}

export async function startImportJobRunner(schema: string): Promise<ImportJobRunner> {
  const s3 = await startS3Fake();
  const boss = await startJobRunner({
    databaseUrl: process.env.DATABASE_URL!,
    logger: silentLogger(),
    cron: false,
    schema,
  });
  await createImportQueue(boss);
  let working = false;
  return {
    s3,
    boss,
    appOptions: { storage: s3.config, imports: importJobs(boss) },
    async work({ db, pool, logger }) {
      if (working) return;
      working = true;
      await workImports(boss, {
        db,
        pool,
        storage: createS3Storage(s3.config),
        logger,
        pollingIntervalSeconds: 0.5,
      });
    },
    async close() {
      await boss.stop({ graceful: false });
      await s3.dispose();
    },
  };
}

export interface ImportWorld {
  t: TestApp;
  s3: S3Fake;
  boss: PgBoss;
  baseUrl: string;
  /** Starts working the queue (some tests look at a queued import first). */
  work(): Promise<void>;
  close(): Promise<void>;
}

/** The import jobs behind an app listening on loopback with its live hub (API tests). */
export async function startImportWorld(
  schema: string,
  options: { work?: boolean } = {},
): Promise<ImportWorld> {
  const runner = await startImportJobRunner(schema);
  const t = makeTestApp({ ...runner.appOptions, listen: true });
  const hub = startLiveHub({
    listener: t.listener!,
    db: t.db,
    sessions: t.sessions,
    allowedHosts: t.allowedHosts,
  });
  await t.listener!.ready;
  const server = http.createServer(t.app);
  hub.attach(server);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const work = () => runner.work(t);
  if (options.work ?? true) await work();
  return {
    t,
    s3: runner.s3,
    boss: runner.boss,
    baseUrl,
    work,
    async close() {
      await runner.boss.stop({ graceful: false });
      await hub.close();
      await t.listener!.close();
      server.closeAllConnections();
      await new Promise((resolve) => server.close(resolve));
      await t.pool.end();
      await runner.s3.dispose();
    },
  };
}

/** Time (ISO, UTC), air °C, RH % and a surface column, as most test files name them. */
export const ISO_MAPPING: ImportMapping = {
  timeColumn: 'time',
  airColumn: 'air',
  rhColumn: 'rh',
  surfaceColumn: 'surface',
  temperatureUnit: 'C',
  timeFormat: 'iso',
  timeZone: 'UTC',
};

export const importsPath = (shopId: string, sensorId: string) =>
  `/api/v1/shops/${shopId}/sensors/${sensorId}/imports`;

/** Uploads a file as the person of `agent`; the raw response. */
export function upload(
  agent: ReturnType<typeof request.agent>,
  path: string,
  content: string | Buffer,
  name = 'logger.csv',
) {
  const bytes = typeof content === 'string' ? Buffer.from(content) : content;
  return agent.post(path).attach('file', bytes, name);
}

/** Polls GET …/imports/:id until it has ended (done, failed, cancelled). */
export async function waitForEnd(
  agent: ReturnType<typeof request.agent>,
  path: string,
  timeoutMs = 30_000,
): Promise<Import> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await agent.get(path).expect(200);
    const imp = res.body.import as Import;
    if (['done', 'failed', 'cancelled'].includes(imp.status)) return imp;
    if (Date.now() > deadline) throw new Error(`import still ${imp.status} after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Upload, start with this mapping and wait for the end: the import as it ended. */
export async function importFile(
  agent: ReturnType<typeof request.agent>,
  shopId: string,
  sensorId: string,
  content: string,
  mapping: ImportMapping,
): Promise<Import> {
  const base = importsPath(shopId, sensorId);
  const up = await upload(agent, base, content).expect(201);
  const id = up.body.import.id as string;
  await agent.post(`${base}/${id}/start`).send({ mapping, remember: false }).expect(202);
  return waitForEnd(agent, `${base}/${id}`);
}
