// Every icon a workbench template or component names is one the app registers (app/icons/app-icons.ts),
// and every registered icon is used: the app downloads its icons with its code, so none may be missing
// (it would show nothing) and none should ride along unused. Dynamic names typed `AppIconName` are
// checked by the compiler; this finds the literal names in templates and in `[svgIcon]` and `icon`
// bindings.
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const appDir = fileURLToPath(new URL('../../projects/workbench/src/app/', import.meta.url));
/** The first load's icons (FIRST_LOAD_ICONS) and the others (LATER_ICONS, a chunk of their own). */
const iconFiles = [
  { path: join(appDir, 'icons', 'app-icons.ts'), list: 'FIRST_LOAD_ICONS' },
  { path: join(appDir, 'icons', 'app-icons-later.ts'), list: 'LATER_ICONS' },
];

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) return sourceFiles(path);
    return /\.(html|ts)$/.test(entry.name) && !entry.name.endsWith('.spec.ts') ? [path] : [];
  });
}

/** The names a list of icons registers. */
function namesIn(path: string, list: string): string[] {
  const text = readFileSync(path, 'utf8');
  const body = text.slice(text.indexOf(`export const ${list} = {`), text.indexOf('} as const'));
  return [...body.matchAll(/^\s+(\w+): \w+Svg,$/gm)].map((match) => match[1]!);
}

/** The names the app registers, in either list. */
function registeredNames(): Set<string> {
  return new Set(iconFiles.flatMap(({ path, list }) => namesIn(path, list)));
}

/** The icon names a source file gives literally: `svgIcon="x"`, quoted names in `[svgIcon]="…"`,
 * `icon="x"` and `[icon]="…"` on our own components, and `icon: 'x'` in objects typed AppIconName. */
function namedIcons(text: string): string[] {
  const names: string[] = [];
  for (const match of text.matchAll(/\bsvgIcon="([a-z0-9_]+)"/g)) names.push(match[1]!);
  for (const match of text.matchAll(/\[(?:svgIcon|icon)\]="([^"]+)"/g)) {
    for (const quoted of match[1]!.matchAll(/'([a-z0-9_]+)'/g)) {
      // A comparison's operand is not an icon (`status === 'active' ? …`).
      if (!new RegExp(`===?\\s*'${quoted[1]}'`).test(match[1]!)) names.push(quoted[1]!);
    }
  }
  for (const match of text.matchAll(/\sicon="([a-z0-9_]+)"/g)) names.push(match[1]!);
  for (const match of text.matchAll(/\bicon: '([a-z0-9_]+)'/g)) names.push(match[1]!);
  return names;
}

describe('the workbench icons', () => {
  const registered = registeredNames();
  const used = new Map<string, string>();
  for (const file of sourceFiles(appDir)) {
    if (iconFiles.some(({ path }) => path === file)) continue;
    for (const name of namedIcons(readFileSync(file, 'utf8'))) used.set(name, file);
  }

  it('registers a few dozen icons, read from app-icons.ts', () => {
    expect(registered.size).toBeGreaterThan(50);
    expect(registered.has('warning')).toBe(true);
  });

  it('registers every icon that a template or component names', () => {
    const missing = [...used].filter(([name]) => !registered.has(name)).map(([n, f]) => `${n} (${f})`);
    expect(missing).toEqual([]);
  });

  it('keeps each icon in one list: the first load’s or the later one', () => {
    const [first = [], later = []] = iconFiles.map(({ path, list }) => namesIn(path, list));
    expect(first.length).toBeGreaterThan(10);
    expect(later.length).toBeGreaterThan(10);
    expect(first.filter((name) => later.includes(name))).toEqual([]);
  });

  it('registers no icon that nothing names', () => {
    expect([...registered].filter((name) => !used.has(name))).toEqual([]);
  });

  it('has no icon font left: every mat-icon names an SVG icon', () => {
    const ligatures = sourceFiles(appDir).filter((file) =>
      /<mat-icon[^>]*[^/]>\s*[\w{]/.test(readFileSync(file, 'utf8')),
    );
    expect(ligatures).toEqual([]);
  });
});
