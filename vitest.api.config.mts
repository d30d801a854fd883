import { defineConfig } from 'vitest/config';

// API tests: each file starts a real `next start` server of the built app on a temporary database.
// One file at a time in one process: the two cores go to the server, not to parallel test workers.
export default defineConfig({
  resolve: { alias: { '@': import.meta.dirname } },
  test: {
    include: ['tests/api/**/*.test.ts'],
    environment: 'node',
    pool: 'forks',
    maxWorkers: 1,
    fileParallelism: false,
    testTimeout: 60_000,
    hookTimeout: 180_000,
  },
});
