/**
 * The files of the smallest Angular app a dealer might write against the packed `@counterpoise/ng`: one
 * standalone component that imports every public entry point of the package, shows the safety notice, and
 * brands it through the theme mixins the package ships. The API entry (zod, the schemas and the engine's
 * routes) is imported dynamically, as the solvers import it, so that it stays out of the first load.
 */

/** Entry points the app loads on demand rather than with its first chunk. */
export const DEFERRED_ENTRIES: readonly string[] = ['@counterpoise/ng/api'];

/** A public entry point of the package and the name its namespace import gets in the app. */
export interface ConsumedEntry {
  /** The import path, e.g. `@counterpoise/ng/core`. */
  readonly specifier: string;
  /** A valid identifier for `import * as <alias>`. */
  readonly alias: string;
}

/** The entry points a dealer's app may import: every export of the package but its test harnesses. */
export function consumedEntries(exportsField: Record<string, unknown>): ConsumedEntry[] {
  return Object.keys(exportsField)
    .filter((key) => key === '.' || (/^\.\/[\w-]+$/.test(key) && key !== './package.json'))
    .map((key) => {
      const specifier = key === '.' ? '@counterpoise/ng' : `@counterpoise/ng/${key.slice(2)}`;
      const alias = key === '.' ? 'root' : key.slice(2).replace(/-(\w)/g, (_, c: string) => c.toUpperCase());
      return { specifier, alias: `${alias}Entry` };
    });
}

/** The app's files, by path relative to its folder. */
export function consumerAppFiles(entries: readonly ConsumedEntry[]): Record<string, string> {
  const eager = entries.filter((e) => !DEFERRED_ENTRIES.includes(e.specifier));
  const deferred = entries.filter((e) => DEFERRED_ENTRIES.includes(e.specifier));
  const imports = eager.map((e) => `import * as ${e.alias} from '${e.specifier}';`).join('\n');
  const counts = eager.map((e) => `  ['${e.specifier}', Object.keys(${e.alias}).length],`).join('\n');
  const loaders = deferred.map((e) => `  ['${e.specifier}', () => import('${e.specifier}')],`).join('\n');
  return {
    'angular.json': JSON.stringify(
      {
        version: 1,
        cli: { analytics: false, cache: { enabled: false } },
        projects: {
          portal: {
            projectType: 'application',
            root: '',
            sourceRoot: 'src',
            architect: {
              build: {
                builder: '@angular/build:application',
                options: {
                  browser: 'src/main.ts',
                  tsConfig: 'tsconfig.json',
                  outputPath: 'dist',
                  index: 'src/index.html',
                  styles: ['src/styles.scss'],
                  optimization: true,
                  outputHashing: 'none',
                  sourceMap: false,
                },
              },
            },
          },
        },
      },
      null,
      2,
    ),
    'tsconfig.json': JSON.stringify(
      {
        compilerOptions: {
          strict: true,
          target: 'ES2022',
          module: 'preserve',
          moduleResolution: 'bundler',
          lib: ['ES2023', 'DOM'],
          skipLibCheck: false,
          isolatedModules: true,
          types: [],
        },
        angularCompilerOptions: { strictTemplates: true, strictInjectionParameters: true },
        files: ['src/main.ts'],
      },
      null,
      2,
    ),
    'src/index.html': [
      '<!doctype html>',
      '<html lang="en">',
      '  <head><meta charset="utf-8" /><title>Service portal</title></head>',
      '  <body><portal-root></portal-root></body>',
      '</html>',
      '',
    ].join('\n'),
    'src/styles.scss': [
      "@use '@counterpoise/ng/core/safety-notice-theme' as notice;",
      '',
      'html {',
      '  @include notice.theme();',
      '}',
      '',
      '.portal-brand {',
      '  @include notice.overrides((accent-color: #7a3e00, container-color: #fff4e0));',
      '}',
      '',
    ].join('\n'),
    'src/main.ts': [
      "import { bootstrapApplication } from '@angular/platform-browser';",
      "import { provideZonelessChangeDetection } from '@angular/core';",
      "import { Portal } from './portal';",
      '',
      'bootstrapApplication(Portal, { providers: [provideZonelessChangeDetection()] }).catch((error: unknown) =>',
      '  console.error(error),',
      ');',
      '',
    ].join('\n'),
    'src/portal.ts': [
      "import { ChangeDetectionStrategy, Component, afterNextRender, signal } from '@angular/core';",
      "import { CpSafetyNotice } from '@counterpoise/ng/core';",
      imports,
      '',
      '/** Every public entry point of the package, so that each one is compiled, linked and bundled. */',
      'const EXPORT_COUNTS: readonly (readonly [string, number])[] = [',
      counts,
      '];',
      '',
      '/** The entries loaded on demand, each in a chunk of its own. */',
      'const LOADERS: readonly (readonly [string, () => Promise<object>])[] = [',
      loaders,
      '];',
      '',
      '@Component({',
      "  selector: 'portal-root',",
      '  imports: [CpSafetyNotice],',
      '  changeDetection: ChangeDetectionStrategy.OnPush,',
      '  template: `',
      '    <div class="portal-brand">',
      '      <cp-safety-notice heading="Before the service run" [topics]="[\'running\', \'weights\']" />',
      '    </div>',
      '    <ul>',
      '      @for (entry of exportCounts(); track entry[0]) {',
      '        <li>{{ entry[0] }}: {{ entry[1] }} exports</li>',
      '      }',
      '    </ul>',
      '  `,',
      '})',
      'export class Portal {',
      '  protected readonly exportCounts = signal(EXPORT_COUNTS);',
      '',
      '  constructor() {',
      '    afterNextRender(async () => {',
      '      for (const [specifier, load] of LOADERS) {',
      '        const entry = await load();',
      '        this.exportCounts.update((counts) => [...counts, [specifier, Object.keys(entry).length] as const]);',
      '      }',
      '    });',
      '  }',
      '}',
      '',
    ].join('\n'),
  };
}
