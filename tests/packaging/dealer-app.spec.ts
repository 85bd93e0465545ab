import { cpSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installTarball, ng, packLibrary, ROOT } from './dealer-install';

/*
 * The dealers' guide's example app (docs/examples/dealer-app), built and tested against the packed
 * tarball as a dealer would: so that every sample the guide takes from it is code that works with the
 * package as published. Its package.json lists Angular for a dealer's own install; here Angular comes
 * linked from this workspace, and only the tarball is installed.
 */

const EXAMPLE = join(ROOT, 'docs', 'examples', 'dealer-app');
const GUIDE = join(ROOT, 'docs', 'dealers');

/** A fenced code block of the dealers' guide, and the example app's file it says it comes from. */
interface GuideSample {
  readonly page: string;
  readonly language: string;
  readonly source: string | null;
  readonly code: string;
}

/** Every fenced block of every page of the guide; `<!-- example: path -->` on the line before names its file. */
function guideSamples(): GuideSample[] {
  const samples: GuideSample[] = [];
  for (const page of readdirSync(GUIDE).filter((name) => name.endsWith('.md'))) {
    const text = readFileSync(join(GUIDE, page), 'utf8');
    for (const match of text.matchAll(/(?:<!-- example: (\S+) -->\n)?```(\w*)\n([\s\S]*?)\n```/g)) {
      samples.push({ page, source: match[1] ?? null, language: match[2]!, code: match[3]! });
    }
  }
  return samples;
}

/** The lines of a text without their indentation and without blank lines, joined again. */
const lines = (text: string) =>
  text
    .split('\n')
    .map((line) => line.trim())
    .filter((line) => line !== '')
    .join('\n');
const LEFT_OUT = new Set(['node_modules', 'dist', '.angular', 'out-tsc', 'package.json']);

let work: string;
let app: string;
let build: { status: number | null; output: string };
let test: { status: number | null; output: string };

describe("the dealers' guide", () => {
  it('takes every code sample but shell commands from the example app, word for word', () => {
    const samples = guideSamples();
    expect(samples.length).toBeGreaterThan(10);
    const unsourced = samples.filter((sample) => sample.source === null && sample.language !== 'sh');
    expect(unsourced.map((sample) => `${sample.page}: ${sample.code.split('\n')[0]}`)).toEqual([]);
    const missing = samples
      .filter((sample) => sample.source !== null)
      .filter((sample) => {
        const file = join(EXAMPLE, sample.source!);
        return !existsSync(file) || !lines(readFileSync(file, 'utf8')).includes(lines(sample.code));
      })
      .map((sample) => `${sample.page}: not in ${sample.source}: ${sample.code.split('\n')[0]!.trim()}`);
    expect(missing).toEqual([]);
  });
});

describe('the example dealer app', () => {
  beforeAll(() => {
    work = mkdtempSync(join(tmpdir(), 'counterpoise-dealer-app-'));
    app = join(work, 'dealer-app');
    cpSync(EXAMPLE, app, {
      recursive: true,
      filter: (source) => {
        const path = relative(EXAMPLE, source);
        return !LEFT_OUT.has(path.split('/')[0]!) && !path.endsWith('.tgz');
      },
    });
    const packed = packLibrary(app);
    installTarball(app, packed.filename);
    build = ng(app, ['build']);
    test = ng(app, ['test', '--watch=false']);
  }, 600_000);

  afterAll(() => {
    if (work) rmSync(work, { recursive: true, force: true });
  });

  it('is kept as source only: no installed packages, build output or tarball in the repository', () => {
    const kept = readdirSync(EXAMPLE);
    for (const name of ['node_modules', 'dist', '.angular']) expect(kept).not.toContain(name);
    expect(kept.filter((name) => name.endsWith('.tgz'))).toEqual([]);
  });

  it('names the tarball as its @counterpoise/ng dependency, as `npm install ./counterpoise-ng-*.tgz` writes it', () => {
    const manifest = JSON.parse(readFileSync(join(EXAMPLE, 'package.json'), 'utf8'));
    const library = JSON.parse(readFileSync(join(ROOT, 'dist', 'counterpoise', 'package.json'), 'utf8'));
    expect(manifest.dependencies['@counterpoise/ng']).toBe(`file:counterpoise-ng-${library.version}.tgz`);
    expect(
      Object.keys(manifest.dependencies).filter((name: string) => name.startsWith('@counterpoise/')),
    ).toEqual(['@counterpoise/ng']);
  });

  it('builds for production with the Angular CLI', () => {
    expect(build.output).not.toMatch(/\[ERROR\]/);
    expect(build.status, build.output).toBe(0);
    expect(existsSync(join(app, 'dist', 'browser', 'index.html'))).toBe(true);
  });

  it("puts the dealer's brand into the widgets' tokens, light and dark", () => {
    const styles = readdirSync(join(app, 'dist', 'browser')).find((file) => /^styles.*\.css$/.test(file));
    const css = readFileSync(join(app, 'dist', 'browser', styles!), 'utf8');
    expect(css).toMatch(/--cp-phase-dial-pointer-color:\s*light-dark\(#1f6b3a,\s*#8fd6a4\)/);
    expect(css).toMatch(/--cp-weight-calculator-figure-color:\s*light-dark\(#1f6b3a,\s*#8fd6a4\)/);
  });

  it('passes its page test, written with the harnesses of the package, on the local engine', () => {
    expect(test.status, test.output).toBe(0);
    expect(test.output).toMatch(/Tests\s+3 passed/);
  });
});
