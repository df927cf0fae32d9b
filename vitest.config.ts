import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const here = (path: string) => fileURLToPath(new URL(path, import.meta.url));

export default defineConfig({
  resolve: {
    alias: {
      '@loadwright/forecasting': here('libs/forecasting/src/index.ts'),
      '@loadwright/db': here('libs/db/src/index.ts'),
      '@loadwright/contracts': here('libs/contracts/src/index.ts'),
    },
  },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['libs/**/*.spec.ts', 'apps/api/**/*.spec.ts', 'apps/cli/**/*.spec.ts', 'apps/web/src/**/*.spec.ts', 'jobs/**/*.spec.ts', 'fixtures/**/*.spec.ts', 'scripts/**/*.spec.ts'],
        },
      },
      {
        extends: true,
        test: {
          name: 'integration',
          include: ['tests/**/*.test.ts'],
          globalSetup: ['tests/support/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
