// A real S3 API for tests: s3rver on a free loopback port, its data in a fresh temporary
// directory, the bucket made at start. stop() and start() again on the same port and directory
// let a test take the store away and bring it back with what it held.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import S3rver from 's3rver';

import type { StorageConfig } from '@/server/storage';

export const TEST_BUCKET = 'drybench-photos-test';
// s3rver accepts only these well-known credentials (its README).
const KEY = 'S3RVER';

export interface S3Fake {
  config: StorageConfig;
  /** Every key under a prefix, read straight from the store (not through the app). */
  keys(prefix: string): Promise<string[]>;
  stop(): Promise<void>;
  start(): Promise<void>;
  /** Stop and delete the data directory. */
  dispose(): Promise<void>;
}

export async function startS3Fake(): Promise<S3Fake> {
  const directory = fs.mkdtempSync(path.join(os.tmpdir(), 'drybench-s3-'));
  let port = 0;
  let server: S3rver | null = null;
  const start = async () => {
    const s = new S3rver({
      address: '127.0.0.1',
      port,
      silent: true,
      directory,
      vhostBuckets: false,
      configureBuckets: [{ name: TEST_BUCKET, configs: [] }],
    });
    port = (await s.run()).port;
    server = s;
  };
  await start();
  const config: StorageConfig = {
    endpoint: `http://127.0.0.1:${port}`,
    bucket: TEST_BUCKET,
    accessKeyId: KEY,
    secretAccessKey: KEY,
    region: 'us-east-1',
    // One try: a test of the store being away should not wait through the SDK's back-off.
    maxAttempts: 1,
  };
  const client = new S3Client({
    endpoint: config.endpoint,
    region: config.region,
    credentials: { accessKeyId: KEY, secretAccessKey: KEY },
    forcePathStyle: true,
  });
  const stop = async () => {
    const s = server;
    server = null;
    await s?.close();
  };
  return {
    config,
    async keys(prefix) {
      const out = await client.send(
        new ListObjectsV2Command({ Bucket: TEST_BUCKET, Prefix: prefix }),
      );
      return (out.Contents ?? []).map((o) => o.Key!).sort();
    },
    stop,
    start,
    async dispose() {
      await stop();
      client.destroy();
      fs.rmSync(directory, { recursive: true, force: true });
    },
  };
}
