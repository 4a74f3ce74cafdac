// Mutation testing (`npm run mutation`, not part of `npm test`): Stryker changes one operator,
// condition or constant at a time in the code below and runs the unit and API tests that cover
// it; a change no test notices is a gap. The report is written to reports/mutation/.
// Narrow a run: `npm run mutation -- --mutate server/physics/fatigue.ts` with
// MUTATION_TESTS=tests/physics/fatigue.test.ts; MUTATION_REPORT names the report files (default
// reports/mutation/mutation, written as .json and .html).
const report = (process.env.MUTATION_REPORT ?? 'reports/mutation/mutation').replace(/\.json$/, '');

/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
export default {
  testRunner: 'vitest',
  vitest: { configFile: 'vitest.mutation.config.ts', related: false },
  mutate: [
    'server/physics/**/*.ts',
    'server/wear/**/*.ts',
    'server/inspections/schedule.ts',
    'server/http/access.ts',
    'server/http/mechanic-scope.ts',
    'server/trips/**/*.ts',
    'server/mail/**/*.ts',
    'server/reliability/**/*.ts',
  ],
  coverageAnalysis: 'perTest',
  concurrency: 2,
  ignoreStatic: true,
  timeoutMS: 60_000,
  reporters: ['clear-text', 'progress', 'html', 'json'],
  htmlReporter: { fileName: `${report}.html` },
  jsonReporter: { fileName: `${report}.json` },
  tempDirName: '.stryker-tmp',
  cleanTempDir: 'always',
};
