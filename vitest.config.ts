import { defineConfig } from 'vitest/config';

/**
 * Two projects: `unit` needs nothing running (engine, readers, pure helpers);
 * `integration` talks to real MariaDB, Redis, the S3 fake and the SMTP fake,
 * which its global set-up starts on free loopback ports unless `npm test`
 * already did.
 */
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts', 'src/**/*.spec.ts'],
          environment: 'node',
          testTimeout: 60_000,
        },
      },
      {
        test: {
          name: 'integration',
          include: ['tests/integration/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
