// Three projects: pure unit tests, API tests on the real test database, and browser tests in
// Debian's Chromium. scripts/test.sh starts the database and passes DATABASE_URL.
import path from 'node:path';
import { fileURLToPath } from 'node:url';

import { defineConfig } from 'vitest/config';

const root = path.dirname(fileURLToPath(import.meta.url));

export default defineConfig({
  resolve: { alias: { '@': root } },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['tests/ingest/**/*.test.ts', 'tests/scripts/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        // Pure UI helpers; react-native resolves to react-native-web as in the web bundle.
        extends: true,
        resolve: { alias: { 'react-native': 'react-native-web' } },
        test: {
          name: 'components',
          include: ['tests/components/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          include: ['tests/server/**/*.test.ts', 'tests/db/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/setup/migrate.ts'],
          testTimeout: 20_000,
          hookTimeout: 30_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/setup/migrate.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
          // A loaded CI machine can take more than the default second to fetch and render a
          // change; polls still end at the first match, so a longer limit costs nothing when green.
          expect: { poll: { timeout: 8_000, interval: 100 } },
        },
      },
    ],
  },
});
