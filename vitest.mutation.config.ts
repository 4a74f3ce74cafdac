/**
 * The unit and API tests alone, for the mutation run (`npm run mutation`, stryker.config.mjs):
 * browser tests are left out (a mutant never needs them and they take minutes). MUTATION_TESTS
 * (comma-separated globs) narrows the tests further for a quick run over one area;
 * MUTATION_SKIP (a regular expression) leaves out tests whose full name matches, for tests too
 * slow to rerun for every mutant (the profile-against-closed-form sweep takes a minute with the
 * coverage instrumentation on). MUTATION_TEST_TIMEOUT_MS sets the per-test time limit (default 60 s).
 */
import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const unit = ['tests/physics/**/*.test.ts', 'tests/server/**/*.test.ts', 'tests/jobs/**/*.test.ts', 'tests/web/**/*.test.ts'];

export default defineConfig({
  resolve: { alias: { '@contracts': fileURLToPath(new URL('./server/contracts', import.meta.url)), '@': fileURLToPath(new URL('./web/src', import.meta.url)) } },
  test: {
    root: '.',
    include: process.env.MUTATION_TESTS ? process.env.MUTATION_TESTS.split(',') : unit,
    environment: 'node',
    // MUTATION_TEST_TIMEOUT_MS raises it on a busy machine: the coverage counters of the initial run slow hot loops many times over
    testTimeout: Number(process.env.MUTATION_TEST_TIMEOUT_MS ?? 60_000),
    ...(process.env.MUTATION_SKIP ? { testNamePattern: new RegExp(`^(?!.*(?:${process.env.MUTATION_SKIP}))`) } : {}),
    hookTimeout: 120_000,
  },
});
