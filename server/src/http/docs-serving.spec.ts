import { createHash } from 'node:crypto';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../app';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';

/** The inline script of a built page, and its hash as the build lists it. */
const INLINE = 'document.documentElement.classList.toggle("dark", false)';
const INLINE_HASH = `'sha256-${createHash('sha256').update(INLINE).digest('base64')}'`;

let temporary: TemporaryDatabase;
let folder: string;
let docsDir: string;
let staticDir: string;

/** A docs site as scripts/build-docs.mjs leaves it: pages, hashed assets, a catalogue, the hash list. */
function writeSite(dir: string): void {
  const page = (title: string) =>
    `<!doctype html><html><head><title>${title}</title><script>${INLINE}</script></head><body><h1 id="top">${title}</h1></body></html>`;
  mkdirSync(join(dir, 'assets', 'chunks'), { recursive: true });
  mkdirSync(join(dir, 'field-guide'));
  mkdirSync(join(dir, 'widgets', 'assets'), { recursive: true });
  mkdirSync(join(dir, 'samples'));
  writeFileSync(join(dir, 'index.html'), page('Counterpoise documentation'));
  writeFileSync(join(dir, 'methods.html'), page('Balancing methods'));
  writeFileSync(join(dir, 'field-guide', 'index.html'), page('Field guide'));
  writeFileSync(join(dir, 'assets', 'app.BvXz12Ab.js'), 'export const app = 1;');
  writeFileSync(join(dir, 'assets', 'chunks', 'framework.C4Pwhtxe.js'), 'export const vue = 1;');
  writeFileSync(join(dir, 'widgets', 'index.html'), page('Widget catalogue'));
  writeFileSync(join(dir, 'widgets', 'assets', 'iframe-C4Pwhtxe.js'), 'export const story = 1;');
  writeFileSync(join(dir, 'samples', 'readings.csv'), 'run,sensor\ninitial,left\n');
  writeFileSync(join(dir, 'content-security.json'), JSON.stringify({ scriptHashes: [INLINE_HASH] }));
}

beforeAll(() => {
  temporary = openTemporaryDatabase();
  folder = mkdtempSync(join(tmpdir(), 'counterpoise-docs-'));
  docsDir = join(folder, 'docs');
  staticDir = join(folder, 'browser');
  mkdirSync(docsDir);
  mkdirSync(staticDir);
  writeSite(docsDir);
  // A file beside the site, which no path may reach.
  writeFileSync(join(folder, 'secret.txt'), 'not for the browser');
  writeFileSync(
    join(staticDir, 'index.html'),
    '<!doctype html><title>Workbench</title><app-root></app-root>',
  );
});

afterAll(() => {
  temporary.dispose();
  rmSync(folder, { recursive: true, force: true });
});

const appWith = (docs: string | undefined) =>
  createApp({
    database: temporary.database,
    staticDir,
    ...(docs ? { docsDir: docs } : {}),
    log: () => undefined,
  });

describe('the docs site at /docs', () => {
  it('answers the pages, by their file name and by their clean address', async () => {
    const app = appWith(docsDir);
    for (const [path, title] of [
      ['/docs/', 'Counterpoise documentation'],
      ['/docs/index.html', 'Counterpoise documentation'],
      ['/docs/methods.html', 'Balancing methods'],
      ['/docs/methods', 'Balancing methods'],
      ['/docs/field-guide/', 'Field guide'],
      ['/docs/widgets/index.html', 'Widget catalogue'],
      ['/docs/widgets/', 'Widget catalogue'],
    ] as const) {
      const answer = await request(app).get(path).set('Accept', 'text/html');
      expect(answer.status, path).toBe(200);
      expect(answer.type, path).toBe('text/html');
      expect(answer.text, path).toContain(`<h1 id="top">${title}</h1>`);
    }
    const sample = await request(app).get('/docs/samples/readings.csv');
    expect(sample.status).toBe(200);
    expect(sample.type).toBe('text/csv');
  });

  it('moves /docs and a folder without its slash to the address with it, keeping the query', async () => {
    const app = appWith(docsDir);
    const bare = await request(app).get('/docs?from=workbench');
    expect(bare.status).toBe(301);
    expect(bare.headers['location']).toBe('/docs/?from=workbench');
    const folderPage = await request(app).get('/docs/field-guide');
    expect(folderPage.status).toBe(301);
    expect(folderPage.headers['location']).toBe('/docs/field-guide/');
  });

  it('answers a missing page with a 404 problem, never with the workbench', async () => {
    const app = appWith(docsDir);
    for (const path of [
      '/docs/no-such-page',
      '/docs/no-such-page.html',
      '/docs/assets/gone.js',
      '/docs/jobs/42',
    ]) {
      const answer = await request(app).get(path).set('Accept', 'text/html');
      expect(answer.status, path).toBe(404);
      expect(answer.type, path).toBe('application/problem+json');
      expect(answer.body.detail, path).toContain(path);
      expect(answer.text, path).not.toContain('app-root');
    }
    // The workbench still answers its own deep links.
    const workbench = await request(app).get('/jobs/42').set('Accept', 'text/html');
    expect(workbench.status).toBe(200);
    expect(workbench.text).toContain('app-root');
  });

  it('sends nothing from outside the site', async () => {
    const app = appWith(docsDir);
    for (const path of ['/docs/../secret.txt', '/docs/%2e%2e/secret.txt', '/docs/..%2fsecret.txt']) {
      const answer = await request(app).get(path);
      expect(answer.text, path).not.toContain('not for the browser');
      expect([400, 404], path).toContain(answer.status);
    }
    expect((await request(app).get('/docs/%E0%A4%A')).status).toBe(400);
  });

  it('allows the inline scripts the build listed, and eval only in the widget catalogue', async () => {
    const app = appWith(docsDir);
    const page = await request(app).get('/docs/methods.html');
    const policy = String(page.headers['content-security-policy']);
    const scripts = policy.split(';').find((directive) => directive.startsWith('script-src '));
    expect(scripts).toBe(`script-src 'self' ${INLINE_HASH}`);
    expect(policy).toContain("script-src-attr 'none'");
    expect(policy).toContain("frame-ancestors 'self'");
    expect(policy).toContain("object-src 'none'");

    const catalogue = await request(app).get('/docs/widgets/index.html');
    expect(String(catalogue.headers['content-security-policy'])).toContain(
      `script-src 'self' ${INLINE_HASH} 'unsafe-eval'`,
    );
  });

  it('caches hashed assets for a year and checks pages again on each use', async () => {
    const app = appWith(docsDir);
    for (const path of [
      '/docs/assets/app.BvXz12Ab.js',
      '/docs/assets/chunks/framework.C4Pwhtxe.js',
      '/docs/widgets/assets/iframe-C4Pwhtxe.js',
    ]) {
      const answer = await request(app).get(path);
      expect(answer.status, path).toBe(200);
      expect(answer.headers['cache-control'], path).toBe('public, max-age=31536000, immutable');
    }
    for (const path of [
      '/docs/',
      '/docs/methods',
      '/docs/samples/readings.csv',
      '/docs/content-security.json',
    ]) {
      const answer = await request(app).get(path);
      expect(answer.headers['cache-control'], path).toBe('no-cache');
    }
  });

  it('says how to build the site when it is not built, and serves nothing there without a folder', async () => {
    const unbuilt = join(folder, 'not-built');
    mkdirSync(unbuilt, { recursive: true });
    const answer = await request(appWith(unbuilt)).get('/docs/').set('Accept', 'text/html');
    expect(answer.status).toBe(503);
    expect(answer.text).toContain('npm run docs:build');

    const none = await request(appWith(undefined)).get('/docs/methods').set('Accept', 'text/html');
    expect(none.status).toBe(404);
    expect(none.type).toBe('application/problem+json');
    expect(none.text).not.toContain('app-root');
  });
});
