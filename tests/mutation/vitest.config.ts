import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const dir = (p: string) => fileURLToPath(new URL(p, import.meta.url));

// The tests the mutation runs (npm run mutation) use: the shared-code tests, without the files
// that start ngspice (each holds ~0.4 GB; the hand-written reference tests stand in for it).
// LUGBOOK_MUTATION_TESTS (comma-separated globs) narrows them for one folder's run. A mutant in a
// module-level table (a "static" mutant: it acts while the module loads, before any test) is run
// against every selected test file that imports the module, directly or not; for shared/units,
// which nearly every engine test imports, that is most of the suite per mutant. Its run therefore
// selects the tests that read and write values (see DEVELOPERS.md, "Mutation runs").
const selected = process.env.LUGBOOK_MUTATION_TESTS?.split(',')
  .map((g) => g.trim())
  .filter(Boolean);

export default defineConfig({
  root: dir('../..'),
  resolve: {
    alias: { '@/': dir('../../src/'), '@server/': dir('../../server/'), '@shared/': dir('../../shared/') },
  },
  test: {
    environment: 'node',
    include: selected?.length ? selected : ['tests/shared/**/*.test.ts'],
    exclude: [
      'tests/shared/circuit/ngspice-agreement.test.ts',
      'tests/shared/circuit/layouts-ngspice.test.ts',
      'tests/shared/analysis/coil.test.ts',
      'node_modules/**',
    ],
    setupFiles: ['tests/setup/console.ts', 'tests/setup/fast-check.ts'],
    // Smaller sizes for the slowest tests (tests/support/mutation-run.ts) and a fixed fast-check seed.
    env: { LUGBOOK_MUTATION_RUN: '1' },
    testTimeout: 60_000,
  },
});
