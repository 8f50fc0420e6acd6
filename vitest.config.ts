import { defineConfig } from 'vitest/config';

// One test run for the whole repository; each workspace is a project so that
// `npm test` at the root runs everything (unit, API, SDK and browser tests).
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'api',
          root: './api',
          include: ['src/**/*.test.ts', 'test/**/*.test.ts', '../seeds/**/*.test.ts'],
          environment: 'node',
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        test: {
          name: 'sdk',
          root: './sdk',
          include: ['src/**/*.test.ts', 'test/**/*.test.ts'],
          environment: 'node',
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
      './dashboard/vitest.config.ts',
    ],
  },
});
