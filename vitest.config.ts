import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const here = (path: string) => fileURLToPath(new URL(path, import.meta.url));

/** The `@loadwright/*` aliases, read from tsconfig.json so that the two never disagree. */
const tsconfig = JSON.parse(readFileSync(here('tsconfig.json'), 'utf8')) as { compilerOptions: { paths: Record<string, string[]> } };
const alias = Object.fromEntries(Object.entries(tsconfig.compilerOptions.paths).map(([name, [target]]) => [name, here(target!)]));

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: [
            'libs/**/*.spec.ts',
            'apps/api/**/*.spec.ts',
            'apps/cli/**/*.spec.ts',
            'apps/web/src/**/*.spec.ts',
            'jobs/**/*.spec.ts',
            'fixtures/**/*.spec.ts',
            'scripts/**/*.spec.ts',
          ],
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
