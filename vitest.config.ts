import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const fromRoot = (path: string) => fileURLToPath(new URL(path, import.meta.url));

/**
 * Suites that run on Node: the engine and schemas in shared/, the server, the published reference checks
 * and the browser tests. Angular code runs under `ng test` (Angular's unit-test builder, also vitest).
 */
export default defineConfig({
  resolve: {
    alias: {
      '@counterpoise/engine': fromRoot('./shared/engine/index.ts'),
      '@counterpoise/api': fromRoot('./shared/api/index.ts'),
    },
  },
  test: {
    environment: 'node',
    projects: [
      { extends: true, test: { name: 'shared', include: ['shared/**/*.spec.ts'] } },
      { extends: true, test: { name: 'server', include: ['server/**/*.spec.ts'], pool: 'forks' } },
      { extends: true, test: { name: 'reference', include: ['tests/reference/**/*.spec.ts'] } },
      {
        extends: true,
        test: {
          name: 'browser',
          include: ['tests/browser/**/*.spec.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
      {
        extends: true,
        test: { name: 'bench', include: [], benchmark: { include: ['bench/**/*.bench.ts'] } },
      },
    ],
  },
});
