// A remote-only dealer app, built and visited: what a page that computes with the calculator API costs.
// The app is the smallest a dealer would write: one component with the weight calculator, and
// `provideCounterpoise({ solver: 'remote', ... })` (no `provideHttpClient()`: Angular provides HttpClient in
// root, and the remote solver takes the app's own when it is configured). It is built by the Angular CLI
// (production, as `ng build` builds a dealer's app) in a temporary workspace whose `@counterpoise/ng` is the
// built package (dist/counterpoise, `npm run build:lib`), then served and opened in headless Chromium, left
// alone until idle, and every script the page fetched is counted. Used by `npm run bench:sizes`.
import { readFileSync, readdirSync, rmSync } from 'node:fs';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { extname, join } from 'node:path';
import { constants, gzipSync } from 'node:zlib';
import { launchChromium } from '../../tests/browser/support/chromium';
import { buildAngularWorkspace, writeAngularWorkspace } from '../support/angular-workspace';

/** One script of the app's build, gzipped at level 9 as the other figures of bench:sizes. */
export interface AppScript {
  readonly file: string;
  readonly gzipped: number;
  /** In the first load (`<script>` and `modulepreload` of index.html). */
  readonly initial: boolean;
  /** Fetched by the page on its own during the visit (first load, then what it loads when idle). */
  readonly fetched: boolean;
  /** What it holds, in a word or two (the package entries and Angular packages whose code it carries). */
  readonly holds: string;
}

/** The figures of one visit to the remote-only dealer app. */
export interface DealerAppSizes {
  /** The scripts of the first load, gzipped bytes. */
  readonly firstLoad: number;
  /** Every script the visit fetched, left idle (first load included), gzipped bytes. */
  readonly visit: number;
  /** Every script of the build, whether fetched or not, gzipped bytes. */
  readonly built: number;
  readonly scripts: readonly AppScript[];
}

/** The dealer apps measured: the same page, computing remotely, or left to the default (on the device). */
export type DealerAppVariant = 'remote' | 'default';

/** The app's source: one page with the calculator, and the providers of the variant. */
function appSource(variant: DealerAppVariant): string {
  const providers =
    variant === 'remote'
      ? "provideCounterpoise({ solver: 'remote', apiBaseUrl: 'https://calc.example.net', accessToken: () => 'visitor-token' })"
      : '';
  return `import { ChangeDetectionStrategy, Component } from '@angular/core';
import { bootstrapApplication } from '@angular/platform-browser';
${variant === 'remote' ? "import { provideCounterpoise } from '@counterpoise/ng/solver';\n" : ''}import { CpWeightCalculator } from '@counterpoise/ng/weight-calculator';

@Component({
  selector: 'app-root',
  imports: [CpWeightCalculator],
  template: '<h1>Service visit</h1><cp-weight-calculator />',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class ServiceVisitPage {}

bootstrapApplication(ServiceVisitPage, { providers: [${providers}] }).catch((error: unknown) => console.error(error));
`;
}

const INDEX_HTML = `<!doctype html>
<html lang="en">
  <head><meta charset="utf-8" /><title>Service visit</title><base href="/" /></head>
  <body><app-root></app-root></body>
</html>
`;

/** A workspace of the app, whose node_modules are the repository's with the built package added. */
function writeWorkspace(root: string, library: string, variant: DealerAppVariant): string {
  return writeAngularWorkspace(root, {
    project: 'dealer',
    files: { 'src/main.ts': appSource(variant), 'src/index.html': INDEX_HTML },
    // @counterpoise/ng as a dealer installs it: the built package.
    packages: { '@counterpoise/ng': library },
  });
}

/** The package entries and Angular packages a built script carries code of, from the build's metafile. */
function holdings(inputs: Record<string, unknown>): string {
  const names = new Set<string>();
  for (const input of Object.keys(inputs)) {
    const entry = /counterpoise-ng-([\w-]+)\.mjs$/.exec(input)?.[1];
    // ng-packagr's chunks of an entry: `<entry>-<chunk>-<hash>`, the entry's own as `<entry>-counterpoise-ng-<entry>`.
    const chunk = entry?.replace(/-[\w-]{8}$/, '').replace(/^(.+)-counterpoise-ng-\1$/, '$1');
    if (chunk !== undefined) names.add(`cp/${chunk}`);
    const angular = /@angular\/([a-z-]+)\/fesm2022\/([a-z-]+)/.exec(input);
    if (angular?.[2] === 'http' || input.includes('@angular/common/fesm2022/_module-chunk'))
      names.add('HttpClient');
    else if (angular !== null) names.add(`@angular/${angular[1]}`);
    if (input.includes('/zod/')) names.add('zod');
  }
  return [...names].sort().join(', ');
}

/** Serves `dir` on a free port of localhost; index.html for any path without a file. */
async function serve(dir: string) {
  const types: Record<string, string> = {
    '.js': 'text/javascript',
    '.css': 'text/css',
    '.html': 'text/html',
  };
  const server = createServer((request, response) => {
    const path = new URL(request.url ?? '/', 'http://localhost').pathname;
    const file = path === '/' ? 'index.html' : path.slice(1);
    try {
      const body = readFileSync(join(dir, file));
      response.writeHead(200, { 'Content-Type': types[extname(file)] ?? 'application/octet-stream' });
      response.end(body);
    } catch {
      response.writeHead(404).end();
    }
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    close: () => new Promise<void>((done) => server.close(() => done())),
  };
}

/** The scripts a visit fetches: the first load, then whatever the page loads when idle, with no input. */
async function visit(url: string, settleMs: number): Promise<Set<string>> {
  const browser = await launchChromium({ serviceWorkers: 'block' });
  try {
    const page = browser.context.pages()[0] ?? (await browser.context.newPage());
    const scripts = new Set<string>();
    page.on('response', (response) => {
      const path = new URL(response.url()).pathname;
      if (path.endsWith('.js')) scripts.add(path.slice(1));
    });
    await page.goto(url, { waitUntil: 'load' });
    await page.locator('cp-weight-calculator').waitFor();
    // The solvers and the calculator load their chunks once the browser is idle (a timeout of 2 to 3 s).
    await page.waitForTimeout(settleMs);
    return scripts;
  } finally {
    await browser.close();
  }
}

/** Builds the dealer app against `library` (a built dist/counterpoise), visits it and sizes it. */
export async function measureDealerApp(
  root: string,
  library: string,
  variant: DealerAppVariant,
): Promise<DealerAppSizes> {
  const dir = writeWorkspace(root, library, variant);
  try {
    buildAngularWorkspace(root, dir, 'dealer', ['--stats-json']);
    const browserDir = join(dir, 'dist', 'browser');
    const index = readFileSync(join(browserDir, 'index.html'), 'utf8');
    const initial = new Set([...index.matchAll(/(?:src|href)="([^"]+\.js)"/g)].map((match) => match[1]!));
    const metafile = JSON.parse(readFileSync(join(dir, 'dist', 'stats.json'), 'utf8')) as {
      outputs: Record<string, { inputs: Record<string, unknown> }>;
    };
    const server = await serve(browserDir);
    let fetched: Set<string>;
    try {
      fetched = await visit(server.url, 5000);
    } finally {
      await server.close();
    }
    const scripts: AppScript[] = readdirSync(browserDir)
      .filter((file) => file.endsWith('.js'))
      .map((file) => ({
        file,
        gzipped: gzipSync(readFileSync(join(browserDir, file)), { level: constants.Z_BEST_COMPRESSION })
          .byteLength,
        initial: initial.has(file),
        fetched: fetched.has(file),
        holds: holdings(metafile.outputs[`browser/${file}`]?.inputs ?? metafile.outputs[file]?.inputs ?? {}),
      }))
      .sort(
        (a, b) =>
          Number(b.initial) - Number(a.initial) ||
          Number(b.fetched) - Number(a.fetched) ||
          b.gzipped - a.gzipped,
      );
    const sum = (list: readonly AppScript[]) => list.reduce((total, script) => total + script.gzipped, 0);
    return {
      firstLoad: sum(scripts.filter((script) => script.initial)),
      visit: sum(scripts.filter((script) => script.fetched || script.initial)),
      built: sum(scripts),
      scripts,
    };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
