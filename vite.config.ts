import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { compression, defineAlgorithm } from 'vite-plugin-compression2';
import { fileURLToPath } from 'node:url';
import os from 'node:os';

const webSrc = fileURLToPath(new URL('./web/src', import.meta.url));
/** Request and response rules shared with the server (server/contracts imports nothing but zod). */
const contracts = fileURLToPath(new URL('./server/contracts', import.meta.url));

/** Tests that start worker processes on a private Redis (Debian's redis-server): `npm run test:queue`. */
const QUEUE_TESTS = ['tests/jobs/nightly-queue.test.ts', 'tests/server/wear/duty-queue.test.ts'];

/**
 * Test files that replace a module for themselves (vi.mock): they get a fresh module registry of
 * their own, while every other file of a worker shares one (importing the server once per worker
 * instead of once per file).
 */
const MOCKING_TESTS = ['tests/server/wear/duty-threads.test.ts'];

/** Longest test files first, so the two workers finish together (loaded only under vitest). */
const sequencer = process.env.VITEST ? (await import('./tests/support/sequencer')).SlowFirstSequencer : undefined;

export default defineConfig({
  root: 'web',
  plugins: [
    react(),
    tailwindcss(),
    // Brotli and gzip copies of every built script and style sheet at the highest level, served
    // as they are by the app (server/app.ts), so no request spends time compressing them.
    compression({ include: /\.(js|css|svg)$/, threshold: 1024, algorithms: [defineAlgorithm('brotliCompress'), defineAlgorithm('gzip', { level: 9 })] }),
  ],
  resolve: { alias: { '@contracts': contracts, '@': webSrc } },
  build: { outDir: '../dist/web', emptyOutDir: true },
  server: { proxy: { '/api': 'http://localhost:3000', '/tiles': 'http://localhost:3000' } },
  test: {
    root: '.',
    // one test file per core (the default leaves one core idle, which on two cores halves the speed)
    maxWorkers: os.availableParallelism(),
    // The files of one worker share their modules: the server and its dependencies are imported
    // once per worker, not once per file (a file's own state lives in its hooks). Files that
    // replace a module for themselves run in projects that keep the isolation.
    isolate: false,
    sequence: { sequencer },
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          root: '.',
          include: ['tests/physics/**/*.test.ts', 'tests/server/**/*.test.ts', 'tests/jobs/**/*.test.ts', 'tests/web/**/*.test.ts', 'tests/mutation/**/*.test.ts'],
          exclude: [...QUEUE_TESTS, ...MOCKING_TESTS],
          environment: 'node',
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'unit-mocks',
          root: '.',
          include: MOCKING_TESTS,
          isolate: true,
          environment: 'node',
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        // the API and nightly-job suites again, on a private PostgreSQL server (DATABASE_URL)
        extends: true,
        test: {
          name: 'pg',
          root: '.',
          include: ['tests/server/**/*.test.ts', 'tests/jobs/**/*.test.ts'],
          // (the mocking files check worker-thread protocols, not the database)
          exclude: [...QUEUE_TESTS, ...MOCKING_TESTS],
          globalSetup: ['tests/support/postgres-global.ts'],
          environment: 'node',
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        // the nightly job with its duty spread over worker processes through a private Redis
        extends: true,
        test: {
          name: 'queue',
          root: '.',
          include: QUEUE_TESTS,
          isolate: true,
          environment: 'node',
          testTimeout: 600_000,
          hookTimeout: 600_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          root: '.',
          include: ['tests/e2e/**/*.test.ts'],
          // one Chromium for the run, each file connecting to it (tests/support/browser-server.ts)
          globalSetup: ['tests/support/browser-server.ts'],
          environment: 'node',
          testTimeout: 90_000,
          hookTimeout: 120_000,
          // A browser on a busy two-core host can take more than expect.poll's default second.
          expect: { poll: { timeout: 10_000 } },
          // each file boots its own app and browser; two at a time use the time one spends waiting
          fileParallelism: true,
        },
      },
    ],
  },
});
