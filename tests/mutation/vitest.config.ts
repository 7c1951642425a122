import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const dir = (p: string) => fileURLToPath(new URL(p, import.meta.url));

// The tests the mutation runs (npm run mutation) use: the shared-code tests, without the files
// that start ngspice (each holds ~0.4 GB; the hand-written reference tests stand in for it).
export default defineConfig({
  root: dir('../..'),
  resolve: {
    alias: { '@/': dir('../../src/'), '@server/': dir('../../server/'), '@shared/': dir('../../shared/') },
  },
  test: {
    environment: 'node',
    include: ['tests/shared/**/*.test.ts'],
    exclude: [
      'tests/shared/circuit/ngspice-agreement.test.ts',
      'tests/shared/circuit/layouts-ngspice.test.ts',
      'tests/shared/analysis/coil.test.ts',
      'node_modules/**',
    ],
    setupFiles: ['tests/setup/console.ts', 'tests/setup/fast-check.ts'],
    testTimeout: 60_000,
  },
});
