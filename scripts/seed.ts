// Seeds the demo shop when absent and writes fresh demo sensor tokens for the simulator.
import fs from 'node:fs';
import path from 'node:path';

import { createDatabase } from '@/db';
import { DEMO_PASSWORD, DEMO_PEOPLE, seedDemo } from '@/db/seed';
import { hashPassword } from '@/server/auth/password';
import { hashToken, newSensorToken } from '@/server/auth/sensorTokens';

async function main() {
  const tokensFile = process.argv[2] ?? '.data/demo-sensors-dev.json';
  const { pool, db } = createDatabase(process.env.DATABASE_URL ?? '');
  const result = await seedDemo(db, { hashPassword, newToken: newSensorToken, hashToken });
  await pool.end();

  fs.mkdirSync(path.dirname(tokensFile), { recursive: true });
  fs.writeFileSync(tokensFile, JSON.stringify(result.tokens, null, 2), { mode: 0o600 });
  console.log(
    result.created
      ? 'Seeded the demo shop.'
      : 'Demo shop already there; re-issued its sensor tokens.',
  );
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
