// Seeds the demo shop when absent (its care log, trial and photos too: whatever is missing) and
// writes fresh demo sensor tokens for the simulator.
import fs from 'node:fs';
import path from 'node:path';

import { createDatabase } from '@/db';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '@/db/seed';
import { hashPassword } from '@/server/auth/password';
import { hashToken, newSensorToken } from '@/server/auth/sensorTokens';
import { readConfig } from '@/server/config';
import { seedDemoShop, waitForStorage } from '@/server/demo/seedShop';
import { createS3Storage } from '@/server/storage';

// npm start launches the S3 fake beside the migrations: give it a moment to listen.
const STORAGE_WAIT_MS = 15_000;

async function main() {
  const tokensFile = process.argv[2] ?? '.data/demo-sensors-dev.json';
  const storageConfig = readConfig({
    ...process.env,
    // The seed needs no session; the server checks its own secret at start-up.
    SESSION_SECRET: process.env.SESSION_SECRET ?? 'x'.repeat(32),
  }).storage;
  const storage = storageConfig && createS3Storage(storageConfig);
  // Not fatal: the seed then skips the photos with a line of its own, and the next run adds them.
  if (storage && !(await waitForStorage(storage, STORAGE_WAIT_MS))) {
    console.log(`Photo storage at ${storageConfig?.endpoint} did not answer within 15 s.`);
  }
  const { pool, db } = createDatabase(process.env.DATABASE_URL ?? '');
  const result = await seedDemoShop(
    db,
    { hashPassword, newToken: newSensorToken, hashToken },
    { storage, nowMs: Date.now(), log: (line) => console.log(line) },
  );
  await pool.end();

  fs.mkdirSync(path.dirname(tokensFile), { recursive: true });
  fs.writeFileSync(tokensFile, JSON.stringify(result.tokens, null, 2), { mode: 0o600 });
  console.log(
    result.created
      ? 'Seeded the demo shop.'
      : 'Demo shop already there; re-issued its sensor tokens.',
  );
  const { surfaces, careEntries, trials } = result.care;
  if (surfaces + careEntries + trials + result.photos > 0) {
    console.log(
      `Demo care: ${surfaces} surfaces, ${careEntries} care entries, ${trials} trial, ${result.photos} photos added.`,
    );
  }
  console.log(
    `Demo sign-in: ${DEMO_PEOPLE[0].email} / ${DEMO_PASSWORD}  (also ${DEMO_PEOPLE.slice(1)
      .map((p) => `${p.email} as ${p.role}`)
      .join(', ')})`,
  );
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
