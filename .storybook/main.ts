import { fileURLToPath } from 'node:url';
import type { StorybookConfig } from '@storybook/angular-vite';

const fromHere = (path: string) => fileURLToPath(new URL(path, import.meta.url));

/**
 * Storybook for the widget library, on the Vite-based Angular framework: its stories also run as
 * Chromium tests through `@storybook/addon-vitest` (the `storybook` project in vitest.config.ts).
 */
const config: StorybookConfig = {
  stories: ['../projects/counterpoise/**/*.stories.ts'],
  addons: ['@storybook/addon-docs', '@storybook/addon-a11y', '@storybook/addon-vitest'],
  framework: {
    name: '@storybook/angular-vite',
    // An absolute path: the Vite plugin resolves a relative one against whichever folder it runs from.
    options: { tsconfig: fromHere('./tsconfig.json') },
  },
  core: { disableTelemetry: true },
  // The library's own build reads the shared packages from dist/ (ng-packagr cannot compile sources
  // outside its root); Storybook, like the workbench, compiles them from their sources.
  viteFinal: (viteConfig) => {
    const shared = [
      // The package's own entry points for the engine and the schemas (what the solvers import).
      { find: '@counterpoise/ng/engine', replacement: fromHere('../shared/engine/index.ts') },
      { find: '@counterpoise/ng/api', replacement: fromHere('../shared/api/index.ts') },
      { find: '@counterpoise/engine', replacement: fromHere('../shared/engine/index.ts') },
      { find: '@counterpoise/api', replacement: fromHere('../shared/api/index.ts') },
    ];
    const existing = viteConfig.resolve?.alias ?? [];
    const aliases = Array.isArray(existing)
      ? existing
      : Object.entries(existing).map(([find, replacement]) => ({ find, replacement: String(replacement) }));
    return { ...viteConfig, resolve: { ...viteConfig.resolve, alias: [...shared, ...aliases] } };
  },
};

export default config;
