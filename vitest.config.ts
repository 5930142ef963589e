import { defineConfig } from 'vitest/config';

// Two projects: the pure engine, unit and client-logic tests (no database), and the API suite, which
// scripts/test.mjs runs against a throw-away PostgreSQL cluster (TEST_DATABASE_URL).
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'engine',
          include: ['tests/engine/**/*.test.ts', 'tests/unit/**/*.test.ts', 'tests/client/**/*.test.ts'],
          environment: 'node',
          testTimeout: 60_000,
        },
      },
      {
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          testTimeout: 30_000,
          hookTimeout: 60_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
