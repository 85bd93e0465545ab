/**
 * The public surface of `@counterpoise/ng`: every name each entry point exports, with its kind, one line a
 * name, sorted. `tests/packaging/public-surface.spec.ts` holds the library to the list in
 * `tests/packaging/public-surface.txt`, so a change of the public API is a visible, reviewed change of
 * that file (Angular's own "API golden" practice).
 *
 *   npm run api:surface                         rewrites tests/packaging/public-surface.txt
 *   node --import tsx tests/packaging/public-surface.ts [--root D]
 *                                               prints the surface of this (or another) checkout
 */
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import ts from 'typescript';

const here = dirname(fileURLToPath(import.meta.url));
const repoRoot = resolve(here, '..', '..');

/** Every `public-api.ts` below the library folder: one per entry point. */
function entryFiles(libraryDir: string): string[] {
  const found: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const path = join(dir, name);
      if (statSync(path).isDirectory()) walk(path);
      else if (name === 'public-api.ts') found.push(path);
    }
  };
  walk(libraryDir);
  return found.sort();
}

/**
 * The entry points whose sources live outside the library (their ng-package.json names an entry file in
 * shared/): `@counterpoise/ng/engine` and `@counterpoise/ng/api`. Their names are those of the shared
 * packages, reviewed where they change; the surface lists each such entry and the file it ships.
 */
function sharedEntries(libraryDir: string, root: string): string[] {
  const lines: string[] = [];
  for (const name of readdirSync(libraryDir).sort()) {
    const config = join(libraryDir, name, 'ng-package.json');
    if (!existsSync(config)) continue;
    const entryFile = (JSON.parse(readFileSync(config, 'utf8')) as { lib?: { entryFile?: string } }).lib
      ?.entryFile;
    if (!entryFile) continue;
    const target = relative(root, resolve(libraryDir, name, entryFile))
      .split(sep)
      .join('/');
    if (!target.startsWith('projects/')) lines.push(`@counterpoise/ng/${name}  entry ${target}`);
  }
  return lines;
}

/** What kind of thing a declaration is, in the words of the TypeScript source. */
function kindOf(declaration: ts.Declaration | undefined): string {
  if (!declaration) return 'unknown';
  if (ts.isClassDeclaration(declaration)) return 'class';
  if (ts.isFunctionDeclaration(declaration)) return 'function';
  if (ts.isInterfaceDeclaration(declaration)) return 'interface';
  if (ts.isTypeAliasDeclaration(declaration)) return 'type';
  if (ts.isEnumDeclaration(declaration)) return 'enum';
  if (ts.isVariableDeclaration(declaration)) return 'const';
  return ts.SyntaxKind[declaration.kind];
}

/** The surface of the library in `root`: lines "<entry point>  <kind> <name>", sorted. */
export function publicSurface(root = repoRoot): string[] {
  const libraryDir = join(root, 'projects', 'counterpoise');
  const configPath = join(root, 'tsconfig.json');
  const config = ts.readConfigFile(configPath, ts.sys.readFile);
  const parsed = ts.parseJsonConfigFileContent(config.config, ts.sys, root);
  const entries = entryFiles(libraryDir);
  const program = ts.createProgram(entries, { ...parsed.options, noEmit: true });
  const checker = program.getTypeChecker();
  const lines: string[] = [];
  for (const file of entries) {
    const folder = relative(libraryDir, dirname(file)).split(sep).join('/');
    const entry = folder === '' ? '@counterpoise/ng' : `@counterpoise/ng/${folder}`;
    const source = program.getSourceFile(file);
    const moduleSymbol = source && checker.getSymbolAtLocation(source);
    if (!moduleSymbol) continue;
    for (const exported of checker.getExportsOfModule(moduleSymbol)) {
      const target = exported.flags & ts.SymbolFlags.Alias ? checker.getAliasedSymbol(exported) : exported;
      lines.push(`${entry}  ${kindOf(target.declarations?.[0])} ${exported.name}`);
    }
  }
  return [...lines, ...sharedEntries(libraryDir, root)].sort();
}

const isMain = process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
  const rootAt = process.argv.indexOf('--root');
  const root = rootAt > 0 ? resolve(process.argv[rootAt + 1] ?? '.') : repoRoot;
  const text = publicSurface(root).join('\n') + '\n';
  if (process.argv.includes('--write')) {
    writeFileSync(join(here, 'public-surface.txt'), text);
  } else {
    process.stdout.write(text);
  }
}
