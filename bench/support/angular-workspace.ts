// A throwaway Angular workspace of one application, built by the Angular CLI as a user's app would be: the
// benchmarks' apps (a dealer's remote-only app, the baselines of bench:lighthouse) are written into one,
// with the repository's node_modules linked in, and built for production.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';

/** What the workspace holds besides its configuration. */
export interface AngularWorkspaceSource {
  /** The project's name in angular.json. */
  readonly project: string;
  /** Files by path from the workspace's root: at least `src/main.ts` and `src/index.html`. */
  readonly files: Readonly<Record<string, string>>;
  /** The build's global styles (paths from the workspace's root, or packages' files). */
  readonly styles?: readonly string[];
  /** Packages linked in under node_modules in place of the repository's (name → folder). */
  readonly packages?: Readonly<Record<string, string>>;
}

/** Writes the workspace into a new temporary folder and returns the folder. */
export function writeAngularWorkspace(root: string, source: AngularWorkspaceSource): string {
  const dir = mkdtempSync(join(tmpdir(), `counterpoise-${source.project}-`));
  for (const [path, text] of Object.entries(source.files)) {
    mkdirSync(dirname(join(dir, path)), { recursive: true });
    writeFileSync(join(dir, path), text);
  }
  writeFileSync(
    join(dir, 'tsconfig.json'),
    JSON.stringify({
      compilerOptions: {
        strict: true,
        skipLibCheck: true,
        isolatedModules: true,
        target: 'ES2022',
        module: 'preserve',
        moduleResolution: 'bundler',
        lib: ['ES2023', 'DOM'],
        types: [],
      },
      angularCompilerOptions: { strictTemplates: true },
      files: ['src/main.ts'],
    }),
  );
  writeFileSync(
    join(dir, 'angular.json'),
    JSON.stringify({
      version: 1,
      cli: { analytics: false },
      newProjectRoot: '',
      projects: {
        [source.project]: {
          projectType: 'application',
          root: '',
          sourceRoot: 'src',
          architect: {
            build: {
              builder: '@angular/build:application',
              options: {
                browser: 'src/main.ts',
                index: 'src/index.html',
                tsConfig: 'tsconfig.json',
                outputPath: 'dist',
                styles: source.styles ?? [],
                optimization: true,
                outputHashing: 'all',
                sourceMap: false,
                extractLicenses: false,
              },
            },
          },
        },
      },
    }),
  );
  // node_modules: the repository's packages, and those the source names in their place.
  const modules = join(dir, 'node_modules');
  const own = source.packages ?? {};
  mkdirSync(modules);
  for (const name of Object.keys(own)) mkdirSync(dirname(join(modules, name)), { recursive: true });
  for (const name of readdirSync(join(root, 'node_modules'))) {
    if (Object.keys(own).some((mine) => mine === name || mine.startsWith(`${name}/`))) continue;
    symlinkSync(join(root, 'node_modules', name), join(modules, name));
  }
  for (const [name, folder] of Object.entries(own)) symlinkSync(folder, join(modules, name));
  return dir;
}

/** `ng build <project> [args]` in the workspace; throws with the CLI's output when the build fails. */
export function buildAngularWorkspace(root: string, dir: string, project: string, args: string[] = []): void {
  const built = spawnSync(
    process.execPath,
    [join(root, 'node_modules', '@angular', 'cli', 'bin', 'ng.js'), 'build', project, ...args],
    {
      cwd: dir,
      encoding: 'utf8',
      env: { ...process.env, NG_CLI_ANALYTICS: 'false', NG_FORCE_TTY: 'false' },
    },
  );
  if (built.status !== 0) throw new Error(`${project} did not build:\n${built.stdout}\n${built.stderr}`);
}
