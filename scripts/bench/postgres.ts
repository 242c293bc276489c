/**
 * The bench's own PostgreSQL (scripts/db.sh, name `bench`), with a fresh database each run so
 * every run starts from an empty readings table: how full the table and its index are changes
 * the insert rate, and runs should be comparable. db.sh installs Debian's PostgreSQL and its
 * pg_partman package (the readings' month partitions, migration 0014) when they are missing.
 */
import { execFileSync } from 'node:child_process';

import pg from 'pg';

import { createDatabase } from '@/db';
import { runMigrations } from '@/db/migrate';

import { freePort } from './processes';

export interface BenchDatabase {
  url: string;
  port: number;
  stop(): void;
}

export async function startBenchDatabase(opts: {
  port: number;
  database: string;
  onPortTaken?: (wanted: number, used: number) => void;
  /** Extra `postgres` options (scripts/db.sh's PG_EXTRA_OPTS), e.g. a preloaded library. */
  serverOpts?: string;
}): Promise<BenchDatabase> {
  const dbScript = 'scripts/db.sh';
  const start = (port: number) =>
    execFileSync('bash', [dbScript, 'start', 'bench', String(port), opts.database], {
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'inherit'],
      env: { ...process.env, PG_EXTRA_OPTS: opts.serverOpts ?? '' },
    }).trim();
  let url: string;
  let port = opts.port;
  try {
    url = start(port);
  } catch {
    // The port lies in Linux's ephemeral range, so on a busy machine another program's
    // connection (even one in TIME_WAIT) can hold it for a minute: take a free port instead.
    port = await freePort();
    opts.onPortTaken?.(opts.port, port);
    url = start(port);
  }
  const adminUrl = url.replace(/\/[^/]+$/, '/postgres');
  const stop = () => {
    execFileSync('bash', [dbScript, 'stop', 'bench'], { stdio: 'inherit' });
  };
  try {
    const admin = new pg.Client({ connectionString: adminUrl });
    await admin.connect();
    await admin.query(`drop database if exists "${opts.database}" with (force)`);
    await admin.query(`create database "${opts.database}"`);
    await admin.end();

    const { pool, db } = createDatabase(url, { max: 1 });
    await runMigrations(db);
    await pool.end();
    return { url, port, stop };
  } catch (err) {
    stop();
    throw err;
  }
}
