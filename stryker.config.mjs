// Mutation runs over the engine's shared code (npm run mutation; not part of CI: it is for people,
// like the bench). One folder at a time on a shared machine, e.g.
//   npm run mutation -- --mutate 'shared/series/**/*.ts'
// Incremental: the results are kept in reports/mutation/incremental.json, so a rerun tests only
// the mutants whose code or tests changed.
/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
export default {
  testRunner: 'vitest',
  vitest: { configFile: 'tests/mutation/vitest.config.ts', related: true },
  plugins: ['@stryker-mutator/vitest-runner'],
  mutate: [
    'shared/analysis/**/*.ts',
    'shared/circuit/**/*.ts',
    'shared/taper/**/*.ts',
    'shared/units/**/*.ts',
    'shared/markings/**/*.ts',
    'shared/series/**/*.ts',
  ],
  coverageAnalysis: 'perTest',
  concurrency: 1,
  incremental: true,
  incrementalFile: 'reports/mutation/incremental.json',
  reporters: ['clear-text', 'progress-append-only', 'json'],
  jsonReporter: { fileName: 'reports/mutation/mutation.json' },
  tempDirName: '.stryker-tmp',
  timeoutMS: 20_000,
  thresholds: { high: 90, low: 85, break: null },
};
