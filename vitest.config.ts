// Three test projects: pure unit tests, API tests against a real throwaway PostgreSQL
// (one database per test file, cloned from a migrated and seeded template), and browser tests.
import { defineConfig } from 'vitest/config';
import vue from '@vitejs/plugin-vue';
import { fileURLToPath } from 'node:url';
import LongestFirst from './tests/helpers/sequencer';

// Two workers per project: Vitest's default (cores − 1) leaves one of our two cores idle, and more
// would only make each browser journey slower on a busy machine (the suite is CPU-bound).
const WORKERS = 2;

const alias = {
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
  '@': fileURLToPath(new URL('./src', import.meta.url)),
};

export default defineConfig({
  plugins: [vue()],
  resolve: { alias },
  test: {
    // Longest files first on a fresh clone too (tests/helpers/sequencer.ts).
    sequence: { sequencer: LongestFirst },
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          sequence: { groupOrder: 0 },
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
          maxWorkers: WORKERS,
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          sequence: { groupOrder: 1 },
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/helpers/global-services.ts'],
          setupFiles: ['tests/helpers/per-file-db.ts', 'tests/helpers/close-db-after-file.ts'],
          // Generous: on a two-core machine running other suites an API test can take tens of seconds.
          testTimeout: 90_000,
          hookTimeout: 180_000,
          pool: 'forks',
          isolate: false,
          maxWorkers: WORKERS,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          sequence: { groupOrder: 2 },
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          // server-build.ts compiles the server once for every journey's server (tests/helpers/browser.ts).
          globalSetup: ['tests/helpers/global-services.ts', 'tests/helpers/server-build.ts'],
          setupFiles: ['tests/helpers/per-file-db.ts'],
          // Generous: a journey on a shared two-core machine under heavy load is slow, not wrong.
          testTimeout: 300_000,
          // No retries: a journey starts from its own database and waits for what it caused.
          retry: 0,
          // Each browser test starts its own server on its own database (tests/helpers/fresh-db.ts).
          hookTimeout: 180_000,
          pool: 'forks',
          isolate: false,
          maxWorkers: WORKERS,
        },
      },
    ],
  },
});
