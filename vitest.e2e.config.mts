import { defineConfig } from 'vitest/config';
import path from 'node:path';

// End-to-end tests: a real `next start` server and headless Chromium, one file at a time in one process.
export default defineConfig({
  resolve: { alias: { '@': path.resolve(import.meta.dirname) } },
  test: {
    include: ['tests/e2e/**/*.test.ts'],
    environment: 'node',
    pool: 'forks',
    maxWorkers: 1,
    fileParallelism: false,
    testTimeout: 120_000,
    hookTimeout: 300_000,
  },
});
