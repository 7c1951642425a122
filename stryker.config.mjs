// Mutation runs over the engine's shared code (npm run mutation; not part of CI: it is for people,
// like the bench). One folder at a time on a shared machine, with its own incremental file and its
// own tests (docs/mutation.md), e.g.
//   LUGBOOK_MUTATION_TESTS='tests/shared/markings/**/*.test.ts' npm run mutation -- \
//     --mutate 'shared/markings/**/*.ts' --incrementalFile reports/mutation/markings.incremental.json
// Incremental: a rerun tests only the mutants whose code or covering tests changed. Mutants in
// module-level tables are covered by no test in particular, so after adding tests rerun with --force.
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
