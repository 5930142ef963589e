import { defineConfig } from 'vitest/config';

// Three projects: the pure engine, unit and client-logic tests (no database); the API suite, which
// scripts/test.mjs runs against a throw-away PostgreSQL cluster (TEST_DATABASE_URL); and the route
// tests, which render the walk's real routes in jsdom with a fake fetch at the network boundary.
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
      {
        test: {
          name: 'routes',
          include: ['tests/routes/**/*.test.tsx'],
          environment: 'jsdom',
          setupFiles: ['tests/routes/support/setup.ts'],
          // a step renders the whole demo (94 segments) and the engine runs on every change; the
          // first test of a file also loads the lazy pages: ~20 s measured on 2 cores, so twice that
          testTimeout: 60_000,
        },
      },
    ],
  },
});
