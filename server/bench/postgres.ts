/**
 * The bench's own PostgreSQL (scripts/db.sh, name `bench`), with a fresh database each run so
 * every run starts from an empty readings table: how full the table and its index are changes
 * the insert rate, and runs should be comparable.
 */
import { execFileSync } from 'node:child_process';

import pg from 'pg';

import { createDatabase } from '@/db';
import { runMigrations } from '@/db/migrate';

export interface BenchDatabase {
  url: string;
  port: number;
  stop(): void;
}

export async function startBenchDatabase(opts: {
  port: number;
  database: string;
}): Promise<BenchDatabase> {
  const dbScript = 'scripts/db.sh';
  const url = execFileSync('bash', [dbScript, 'start', 'bench', String(opts.port), opts.database], {
    encoding: 'utf8',
    stdio: ['ignore', 'pipe', 'inherit'],
  }).trim();
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
    return { url, port: opts.port, stop };
  } catch (err) {
    stop();
    throw err;
  }
}
