import { fileURLToPath } from 'node:url';
import { storybookTest } from '@storybook/addon-vitest/vitest-plugin';
import { playwright } from '@vitest/browser-playwright';
import { defineConfig } from 'vitest/config';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from './tests/browser/support/chromium-flags';

const fromRoot = (path: string) => fileURLToPath(new URL(path, import.meta.url));

/** Debian's Chromium (Playwright's own download never works here), kept off the network. */
const chromium = { executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS };

/**
 * Suites that run on Node: the engine and schemas in shared/, the server, the published reference checks
 * and the browser tests. Angular code runs under `ng test` (Angular's unit-test builder, also vitest).
 * The `storybook` project runs every story of the widget library in Chromium: its play function and an
 * axe check (`a11y.test: 'error'` in .storybook/preview.ts).
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
      // Checks that read the workbench's source as text (the icons its templates name).
      { extends: true, test: { name: 'source', include: ['tests/source/**/*.spec.ts'] } },
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
        // The docs: the site's pages and links, and the integrators' guide's examples run against a live server.
        extends: true,
        test: {
          name: 'docs',
          include: ['tests/docs/**/*.spec.ts'],
          testTimeout: 60_000,
          hookTimeout: 300_000,
          fileParallelism: false,
        },
      },
      {
        extends: true,
        test: {
          name: 'packaging',
          include: ['tests/packaging/**/*.spec.ts'],
          testTimeout: 60_000,
          hookTimeout: 180_000,
        },
      },
      {
        extends: true,
        plugins: [storybookTest({ configDir: fromRoot('./.storybook') })],
        test: {
          name: 'storybook',
          browser: {
            enabled: true,
            headless: true,
            provider: playwright({ launchOptions: chromium }),
            instances: [{ browser: 'chromium', viewport: { width: 1024, height: 768 } }],
            // A failing story leaves its screenshot here, out of the source tree.
            screenshotDirectory: fromRoot('./test-results/story-failures'),
          },
        },
      },
      {
        extends: true,
        test: { name: 'bench', include: [], benchmark: { include: ['bench/**/*.bench.ts'] } },
      },
    ],
  },
});
