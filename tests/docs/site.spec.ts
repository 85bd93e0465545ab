import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, statSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join, relative, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { AxeBuilder } from '@axe-core/playwright';
import { JSDOM } from 'jsdom';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/src/app';
import { openTemporaryDatabase, type TemporaryDatabase } from '../../server/src/testing/temporary-database';
import { expectAccessible } from '../browser/support/axe';
import { type Browser, launchChromium } from '../browser/support/chromium';

/**
 * The docs site as a visitor meets it: built by `npm run docs:build` (scripts/build-docs.mjs), served by
 * the real server app at /docs. Every page is loaded, starting from /docs/ and following every link, plus
 * every page the build wrote; every address a page names (href, src, and `#id` on its target page) must
 * answer. Links to other sites are listed and must be on the allowlist below.
 *
 * The site is read from `DOCS_DIR`, else `dist/docs`; it is built there first when it is missing or older
 * than any file under docs/ or DEVELOPERS.md (npm test builds it in the same step, just before).
 */

const root = fileURLToPath(new URL('../..', import.meta.url));
const docsDir = resolve(root, process.env['DOCS_DIR'] ?? 'dist/docs');

/** Addresses of other sites the docs may name: each is a reference a reader follows on purpose. */
const EXTERNAL_ALLOWLIST = new Set([
  'https://pdfmake.github.io/docs/',
  // The generator of the typed client and its fetch library, cited by the integrators' client page.
  'https://openapi-ts.dev/',
  'https://openapi-ts.dev/openapi-fetch/',
]);
/**
 * The local servers the pages tell a reader to start (`npm start`, `npm run dev`, `npm run storybook`):
 * examples, not links.
 */
const EXAMPLE_SERVER = /^http:\/\/localhost:(4200|4300|6006)(\/|$)/;

/** The newest modification time of the files under `dir` (dotted folders such as `.vitepress` included). */
function newestUnder(dir: string): number {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true, recursive: true })) {
    if (!entry.isFile() || entry.parentPath.includes('node_modules')) continue;
    newest = Math.max(newest, statSync(join(entry.parentPath, entry.name)).mtimeMs);
  }
  return newest;
}

function ensureBuilt(): void {
  const index = join(docsDir, 'index.html');
  const sources = Math.max(newestUnder(join(root, 'docs')), statSync(join(root, 'DEVELOPERS.md')).mtimeMs);
  if (existsSync(index) && statSync(index).mtimeMs >= sources && existsSync(join(docsDir, 'widgets'))) return;
  mkdirSync(docsDir, { recursive: true });
  const build = spawnSync(
    process.execPath,
    [join(root, 'scripts/build-docs.mjs'), '--output-path', docsDir],
    {
      cwd: root,
      stdio: 'inherit',
    },
  );
  if (build.status !== 0)
    throw new Error(`npm run docs:build failed (exit ${build.status ?? build.signal}).`);
}

/** Every file under `dir` whose name ends in `suffix`, as paths relative to it. */
function filesUnder(dir: string, suffix: string): string[] {
  return readdirSync(dir, { withFileTypes: true, recursive: true })
    .filter((entry) => entry.isFile() && entry.name.endsWith(suffix))
    .map((entry) => relative(dir, join(entry.parentPath, entry.name)).split('\\').join('/'));
}

let temporary: TemporaryDatabase;
let server: Server;
let origin: string;

beforeAll(async () => {
  ensureBuilt();
  temporary = openTemporaryDatabase();
  const app = createApp({ database: temporary.database, docsDir, log: () => undefined });
  server = await new Promise<Server>((listening) => {
    const started = app.listen(0, '127.0.0.1', () => listening(started));
  });
  origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
}, 900_000);

afterAll(async () => {
  await new Promise((closed) => server?.close(closed));
  temporary?.dispose();
});

interface Fetched {
  readonly status: number;
  readonly type: string;
  /** The ids of the elements of an HTML answer (its anchors); empty for anything else. */
  readonly ids: ReadonlySet<string>;
  /** Every address the page names, with the attribute it is in. */
  readonly links: readonly { readonly attribute: string; readonly url: URL }[];
}

const fetched = new Map<string, Promise<Fetched>>();

/** GETs a path of the server once (following redirects) and reads the ids and links of an HTML answer. */
function load(url: URL): Promise<Fetched> {
  const key = url.pathname + url.search;
  let answer = fetched.get(key);
  if (answer === undefined) {
    answer = (async () => {
      const response = await fetch(new URL(key, origin));
      const type = response.headers.get('content-type') ?? '';
      if (!type.startsWith('text/html')) {
        await response.arrayBuffer();
        return { status: response.status, type, ids: new Set<string>(), links: [] };
      }
      const document = new JSDOM(await response.text()).window.document;
      const ids = new Set([...document.querySelectorAll('[id]')].map((element) => element.id));
      const base = new URL(response.url);
      const links: { attribute: string; url: URL }[] = [];
      for (const attribute of ['href', 'src']) {
        for (const element of document.querySelectorAll(`[${attribute}]`)) {
          const value = element.getAttribute(attribute) ?? '';
          if (value === '' || value.startsWith('javascript:') || value.startsWith('data:')) continue;
          links.push({ attribute, url: new URL(value, base) });
        }
      }
      return { status: response.status, type, ids, links };
    })();
    fetched.set(key, answer);
  }
  return answer;
}

/** Whether an address is a page or file of this server (anything else is another site). */
function isOwn(url: URL): boolean {
  return url.origin === origin;
}

describe('the docs site', () => {
  it('loads every page, and every address, file and anchor a page names resolves', async () => {
    const start = new URL('/docs/', origin);
    const queue: URL[] = [start];
    // Every page the build wrote, reached by a link or not (404.html is the answer to a missing page).
    for (const file of filesUnder(docsDir, '.html')) {
      if (file === '404.html') continue;
      queue.push(new URL(`/docs/${file}`, origin));
    }
    const visited = new Set<string>();
    const problems: string[] = [];
    const external = new Set<string>();
    let pages = 0;

    while (queue.length > 0) {
      const page = queue.shift()!;
      if (visited.has(page.pathname)) continue;
      visited.add(page.pathname);
      const answer = await load(page);
      if (answer.status !== 200) {
        problems.push(`${page.pathname}: ${answer.status}`);
        continue;
      }
      if (!answer.type.startsWith('text/html')) continue;
      pages++;
      for (const { attribute, url } of answer.links) {
        if (url.protocol === 'mailto:') continue;
        if (!isOwn(url)) {
          // Storybook's own pages of the catalogue carry its help links (its error screens' "read the
          // docs"); every other page's links to other sites are ours and must be on the allowlist.
          if (!EXAMPLE_SERVER.test(url.href) && !page.pathname.startsWith('/docs/widgets/')) {
            external.add(`${url.href} (on ${page.pathname})`);
          }
          continue;
        }
        const target = await load(url);
        if (target.status !== 200) {
          problems.push(`${page.pathname}: ${attribute}="${url.pathname}" answers ${target.status}`);
          continue;
        }
        const id = decodeURIComponent(url.hash.slice(1));
        if (id !== '' && target.type.startsWith('text/html') && !target.ids.has(id)) {
          problems.push(
            `${page.pathname}: ${attribute}="${url.pathname}${url.hash}": no element with that id`,
          );
        }
        if (url.pathname.startsWith('/docs/') && target.type.startsWith('text/html')) queue.push(url);
      }
    }

    expect(problems).toEqual([]);
    expect([...external].filter((link) => !EXTERNAL_ALLOWLIST.has(link.split(' (on ')[0]!))).toEqual([]);
    // The doors and the reference pages are all there.
    expect(pages).toBeGreaterThanOrEqual(25);
    for (const path of ['/docs/', '/docs/methods.html', '/docs/benchmarks.html', '/docs/field-guide/']) {
      expect(visited.has(path), path).toBe(true);
    }
  });

  it('answers clean addresses, and a 404 problem for a page it does not have', async () => {
    const clean = await fetch(new URL('/docs/methods', origin));
    expect(clean.status).toBe(200);
    expect(await clean.text()).toContain('influence coefficient');

    const folder = await fetch(new URL('/docs/field-guide', origin), { redirect: 'manual' });
    expect(folder.status).toBe(301);
    expect(folder.headers.get('location')).toBe('/docs/field-guide/');

    const missing = await fetch(new URL('/docs/no-such-page', origin), { headers: { accept: 'text/html' } });
    expect(missing.status).toBe(404);
    expect(missing.headers.get('content-type')).toContain('application/problem+json');
  });

  it('has a search index that finds a phrase of the methods page', async () => {
    const [indexFile] = filesUnder(join(docsDir, 'assets'), '.js').filter((file) =>
      /@localSearchIndexroot\.[^/]+\.js$/.test(file),
    );
    expect(indexFile, 'the local search index of VitePress').toBeDefined();
    const { default: serialized } = (await import(
      pathToFileURL(join(docsDir, 'assets', indexFile!)).href
    )) as {
      default: string;
    };
    // MiniSearch's serialized index: the sections by short id, and each term's postings per field.
    const index = JSON.parse(serialized) as {
      documentIds: Record<string, string>;
      index: [string, Record<string, Record<string, number>>][];
    };
    const sectionsWith = (term: string): Set<string> => {
      const postings = index.index.find(([indexed]) => indexed === term)?.[1] ?? {};
      return new Set(Object.values(postings).flatMap((documents) => Object.keys(documents)));
    };
    const influence = sectionsWith('influence');
    const both = [...sectionsWith('coefficient')].filter((id) => influence.has(id));
    const pages = new Set(both.map((id) => index.documentIds[id]?.split('#')[0]));
    expect(pages).toContain('/docs/methods.html');
    expect(pages).toContain('/docs/field-guide/balancing-job.html');
  });

  it('holds the widget catalogue: every widget’s stories, with the docs and accessibility panels', () => {
    const widgets = join(docsDir, 'widgets');
    const stories = JSON.parse(readFileSync(join(widgets, 'index.json'), 'utf8')) as {
      entries: Record<string, { type: string; importPath: string }>;
    };
    const storyFiles = new Set(
      Object.values(stories.entries)
        .filter((entry) => entry.type === 'story')
        .map((entry) => entry.importPath),
    );
    const expected = filesUnder(join(root, 'projects/counterpoise'), '.stories.ts').map(
      (file) => `./projects/counterpoise/${file}`,
    );
    expect(expected.length).toBeGreaterThan(0);
    expect([...storyFiles].sort()).toEqual(expected.sort());
    const addons = readdirSync(join(widgets, 'sb-addons'));
    expect(addons.some((name) => name.includes('a11y'))).toBe(true);
    expect(addons.some((name) => name.includes('docs'))).toBe(true);
  });
});

describe('the docs site in Chromium', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchChromium();
  });
  afterAll(async () => {
    await browser?.close();
  });

  /** Opens a page and collects what the console reports as errors (a Content-Security-Policy refusal among them). */
  async function open(path: string) {
    const page = await browser.context.newPage();
    const errors: string[] = [];
    page.on('console', (message) => {
      if (message.type() === 'error') errors.push(message.text());
    });
    page.on('pageerror', (error) => errors.push(error.message));
    await page.goto(new URL(path, origin).href, { waitUntil: 'networkidle' });
    return { page, errors };
  }

  it('runs the pages under their Content-Security-Policy, and searches from the keyboard', async () => {
    const { page, errors } = await open('/docs/');
    await expectAccessible(page, 'the docs home page');
    await page.keyboard.press('/');
    // "/" opens the search dialog with its field focused: typing goes straight into it.
    const search = page.locator('#localsearch-input');
    await search.waitFor();
    expect(await search.evaluate((field) => field === document.activeElement)).toBe(true);
    await page.keyboard.type('influence coefficient');
    const result = page.locator('.VPLocalSearchBox .result').first();
    await result.waitFor();
    expect(await result.textContent()).toContain('Balancing methods');
    // VitePress's search dialog lists its results as options holding links, which axe's
    // nested-interactive rule refuses; the theme's own component, every other rule still applies.
    const dialog = await new AxeBuilder({ page })
      .include('.VPLocalSearchBox')
      .disableRules(['nested-interactive'])
      .analyze();
    expect(dialog.violations.map((violation) => violation.id)).toEqual([]);
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/docs\/methods\.html#/);
    await expectAccessible(page, 'the methods page');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('runs the widget catalogue under its Content-Security-Policy', async () => {
    const { page, errors } = await open('/docs/widgets/index.html');
    const preview = page.frameLocator('#storybook-preview-iframe');
    await preview.locator('#storybook-root, #storybook-docs').first().waitFor({ state: 'attached' });
    await page.waitForLoadState('networkidle');
    expect(errors.filter((text) => /Content[- ]Security[- ]Policy|Refused/i.test(text))).toEqual([]);
    await page.close();
  });

  it('draws a story of every widget in the catalogue, with no error', async () => {
    const index = JSON.parse(readFileSync(join(docsDir, 'widgets', 'index.json'), 'utf8')) as {
      entries: Record<string, { id: string; type: string; title: string }>;
    };
    // The first story of each component: a catalogue that lists its stories but cannot draw them (a build
    // whose components were left for the browser to compile, say) fails here.
    const firstStories = new Map<string, string>();
    for (const entry of Object.values(index.entries)) {
      if (entry.type === 'story' && !firstStories.has(entry.title)) firstStories.set(entry.title, entry.id);
    }
    expect(firstStories.size).toBeGreaterThanOrEqual(5);
    for (const [title, id] of firstStories) {
      const page = await browser.context.newPage();
      const errors: string[] = [];
      page.on('console', (message) => {
        // The browser's own request for /favicon.ico (the bare story frame names no icon) is no page error.
        if (message.type() === 'error' && !message.location().url.endsWith('/favicon.ico')) {
          errors.push(message.text());
        }
      });
      page.on('pageerror', (error) => errors.push(error.message));
      await page.goto(new URL(`/docs/widgets/iframe.html?id=${id}&viewMode=story`, origin).href, {
        waitUntil: 'networkidle',
      });
      const widget = page
        .locator('#storybook-root')
        .locator(
          'cp-safety-notice, cp-correction-overlay, cp-phase-dial, cp-polar-plot, cp-weight-calculator',
        );
      await widget.first().waitFor({ timeout: 30_000 });
      expect(await widget.first().innerHTML(), title).not.toBe('');
      expect(errors, title).toEqual([]);
      await page.close();
    }
  });
});
