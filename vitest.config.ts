import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

const alias = {
  '@shared': here('./shared'),
  '@server': here('./server'),
  '@jobs': here('./jobs'),
  '@tests': here('./tests'),
  '@': here('./client/src'),
};

/**
 * One vitest run, several projects: pure unit tests run in parallel; tests that need the private
 * MariaDB, R or Chromium get longer timeouts. `tests/run-all.ts` prepares the services first.
 */
export default defineConfig({
  resolve: { alias },
  test: {
    reporters: ['default'],
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'unit',
          include: ['shared/**/*.test.ts', 'server/**/*.test.ts', 'jobs/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'client',
          include: ['client/**/*.test.{ts,tsx}'],
          environment: 'jsdom',
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'reference',
          include: ['tests/reference/**/*.test.ts'],
          environment: 'node',
          testTimeout: 600_000,
          hookTimeout: 600_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          fileParallelism: false,
          testTimeout: 120_000,
          hookTimeout: 180_000,
        },
      },
    ],
  },
});
