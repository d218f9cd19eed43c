import { defineConfig } from 'vitest/config';

// Two projects: fast pure tests in Node ("unit"), and real-browser tests that build the app and drive
// Debian's chromium through playwright-core ("browser"). `npm test` runs both after type checking.
// A third, the fault run of the production app (test/browser/*.faults.ts, about ten minutes), exists
// only when DG_FAULTS is set: `npm run faults`.
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          environment: 'node',
          include: ['test/**/*.test.ts'],
          exclude: ['test/browser/**'],
          testTimeout: 60_000,
        },
      },
      {
        test: {
          name: 'browser',
          environment: 'node',
          include: ['test/browser/**/*.test.ts'],
          globalSetup: ['test/browser/global-setup.ts'],
          fileParallelism: false,
          testTimeout: 120_000,
          hookTimeout: 180_000,
        },
      },
      ...(process.env.DG_FAULTS
        ? [
            {
              test: {
                name: 'faults',
                environment: 'node',
                include: ['test/browser/*.faults.ts'],
                globalSetup: ['test/browser/global-setup.ts'],
                fileParallelism: false,
                testTimeout: 900_000,
                hookTimeout: 180_000,
              },
            },
          ]
        : []),
    ],
  },
});
