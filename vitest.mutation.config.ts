/**
 * The unit and API tests alone, for the mutation run (`npm run mutation`, stryker.config.mjs):
 * browser tests are left out (a mutant never needs them and they take minutes). MUTATION_TESTS
 * (comma-separated globs) narrows the tests further for a quick run over one area.
 */
import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const unit = ['tests/physics/**/*.test.ts', 'tests/server/**/*.test.ts', 'tests/jobs/**/*.test.ts', 'tests/web/**/*.test.ts'];

export default defineConfig({
  resolve: { alias: { '@': fileURLToPath(new URL('./web/src', import.meta.url)) } },
  test: {
    root: '.',
    include: process.env.MUTATION_TESTS ? process.env.MUTATION_TESTS.split(',') : unit,
    environment: 'node',
    testTimeout: 60_000,
    hookTimeout: 120_000,
  },
});
