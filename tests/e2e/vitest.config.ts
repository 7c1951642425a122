import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const dir = (p: string) => fileURLToPath(new URL(p, import.meta.url));

// End-to-end tests: the real server on a fresh data folder, the built client, headless Chromium.
export default defineConfig({
  root: dir('../..'),
  resolve: {
    alias: { '@/': dir('../../src/'), '@server/': dir('../../server/'), '@shared/': dir('../../shared/') },
  },
  test: {
    include: ['tests/e2e/**/*.e2e.ts'],
    globalSetup: ['tests/e2e/global-setup.ts'],
    testTimeout: 60_000,
    hookTimeout: 180_000,
    fileParallelism: false,
  },
});
