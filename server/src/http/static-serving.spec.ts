import { execFileSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { type IncomingHttpHeaders, request, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ProblemSchema } from '@counterpoise/api';
import { createApp } from '../app';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';

const COMPRESS_SCRIPT = fileURLToPath(new URL('../../../scripts/compress-static.mjs', import.meta.url));

/** What a browser sends: Chromium's Accept-Encoding, and the Accept of a page and of a script. */
const BROWSER_ENCODINGS = 'gzip, deflate, br, zstd';
const PAGE_ACCEPT = 'text/html,application/xhtml+xml,application/xml;q=0.9,*/*;q=0.8';

/** A script of a few kB that compresses as a real bundle does. */
function bundle(name: string): string {
  return Array.from(
    { length: 120 },
    (_, i) =>
      `export function ${name}Step${i}(massGrams, radiusMm) { return (massGrams * ${i + 1}) / radiusMm; }`,
  ).join('\n');
}

/** A built app as `ng build workbench` leaves it, with the files the server treats apart. */
function writeBuild(dir: string): void {
  const index = `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Counterpoise</title>
<meta name="description" content="${'Field balancing of rotating equipment. '.repeat(40)}">
<link rel="manifest" href="manifest.webmanifest"></head><body><app-root></app-root></body></html>`;
  writeFileSync(join(dir, 'index.html'), index);
  writeFileSync(join(dir, 'main-ABCDEFGH.js'), bundle('main'));
  writeFileSync(
    join(dir, 'main-ABCDEFGH.js.map'),
    JSON.stringify({ version: 3, mappings: 'AAAA;'.repeat(800) }),
  );
  writeFileSync(join(dir, 'styles-QRSTUVWX.css'), '.cp-card{margin:8px;padding:16px}\n'.repeat(100));
  writeFileSync(join(dir, 'ngsw-worker.js'), bundle('worker'));
  writeFileSync(
    join(dir, 'ngsw.json'),
    JSON.stringify({ hashTable: { '/a.js': 'b'.repeat(40) }, pad: 'x'.repeat(2000) }),
  );
  writeFileSync(join(dir, 'safety-worker.js'), 'self.addEventListener("install", () => self.skipWaiting());');
  writeFileSync(join(dir, 'color-scheme.js'), 'document.documentElement.dataset.scheme = "dark";');
  writeFileSync(
    join(dir, 'worker-basic.min.js'),
    'self.addEventListener("install", () => self.skipWaiting());',
  );
  writeFileSync(
    join(dir, 'manifest.webmanifest'),
    JSON.stringify({ name: 'Counterpoise', short_name: 'Counterpoise', display: 'standalone' }),
  );
  // Random bytes do not compress: no copy may be kept that is larger than the file.
  writeFileSync(join(dir, 'chunk-RANDOM01.js'), randomBytes(4000));
  // A name of Angular's chunk optimizer (a base64url hash).
  writeFileSync(join(dir, 'chunk-B_bxu6e-.js'), bundle('optimized'));
  writeFileSync(join(dir, 'icon-512.png'), randomBytes(3000));
  mkdirSync(join(dir, 'media'));
  writeFileSync(join(dir, 'media', 'roboto-latin-400-normal-ABCDEFGH.woff2'), randomBytes(3000));
}

interface Answer {
  readonly status: number;
  readonly headers: IncomingHttpHeaders;
  /** The body as sent, still compressed. */
  readonly body: Buffer;
}

let temporary: TemporaryDatabase;
let buildDir: string;
let server: Server;
let compressOutput: string;

/** One request as a browser makes it, the body kept as it came over the wire (no decoding). */
function fetchRaw(path: string, headers: Record<string, string> = {}, method = 'GET'): Promise<Answer> {
  const { port } = server.address() as AddressInfo;
  return new Promise((resolve, reject) => {
    const outgoing = request({ host: '127.0.0.1', port, path, method, headers }, (incoming) => {
      const chunks: Buffer[] = [];
      incoming.on('data', (chunk: Buffer) => chunks.push(chunk));
      incoming.on('end', () =>
        resolve({ status: incoming.statusCode ?? 0, headers: incoming.headers, body: Buffer.concat(chunks) }),
      );
      incoming.on('error', reject);
    });
    outgoing.on('error', reject);
    outgoing.end();
  });
}

/** The body as the browser reads it, after the Content-Encoding is undone. */
function decoded(answer: Answer): Buffer {
  const encoding = answer.headers['content-encoding'];
  if (encoding === 'br') return brotliDecompressSync(answer.body);
  if (encoding === 'gzip') return gunzipSync(answer.body);
  expect(encoding).toBeUndefined();
  return answer.body;
}

const builtFile = (path: string) => readFileSync(join(buildDir, path));

beforeAll(async () => {
  temporary = openTemporaryDatabase();
  const folder = mkdtempSync(join(tmpdir(), 'counterpoise-static-'));
  buildDir = join(folder, 'browser');
  mkdirSync(buildDir);
  // A file beside the build folder, which no path may reach.
  writeFileSync(join(folder, 'secret.txt'), 'not for the browser');
  writeBuild(buildDir);
  compressOutput = execFileSync(process.execPath, [COMPRESS_SCRIPT, buildDir], { encoding: 'utf8' });
  const app = createApp({ database: temporary.database, staticDir: buildDir, log: () => undefined });
  server = await new Promise<Server>((resolve) => {
    const listening = app.listen(0, '127.0.0.1', () => resolve(listening));
  });
});

afterAll(async () => {
  server.closeAllConnections();
  await new Promise<void>((resolve) => server.close(() => resolve()));
  temporary.dispose();
  rmSync(join(buildDir, '..'), { recursive: true, force: true });
});

describe('scripts/compress-static.mjs', () => {
  it('writes a brotli and a gzip copy of every compressible file of at least 1 kB', () => {
    for (const path of [
      'index.html',
      'main-ABCDEFGH.js',
      'styles-QRSTUVWX.css',
      'ngsw-worker.js',
      'ngsw.json',
    ]) {
      const raw = builtFile(path);
      const br = builtFile(`${path}.br`);
      const gz = builtFile(`${path}.gz`);
      expect(brotliDecompressSync(br).equals(raw), path).toBe(true);
      expect(gunzipSync(gz).equals(raw), path).toBe(true);
      expect(br.length, path).toBeLessThan(gz.length);
      expect(gz.length, path).toBeLessThan(raw.length);
    }
  });

  it('leaves alone small files, source maps, fonts and pictures, and keeps no copy larger than the file', () => {
    for (const path of [
      'safety-worker.js',
      'manifest.webmanifest',
      'main-ABCDEFGH.js.map',
      'icon-512.png',
      'media/roboto-latin-400-normal-ABCDEFGH.woff2',
      'chunk-RANDOM01.js',
    ]) {
      expect(existsSync(join(buildDir, `${path}.br`)), path).toBe(false);
      expect(existsSync(join(buildDir, `${path}.gz`)), path).toBe(false);
    }
  });

  it('prints the raw, gzip and brotli totals per kind of file', () => {
    expect(compressOutput).toMatch(/kind\s+files\s+raw\s+gzip\s+brotli/);
    // Counted: index.html, main, the optimizer's chunk, styles, ngsw-worker.js, ngsw.json and the random
    // chunk (kept raw).
    expect(compressOutput).toMatch(/total\s+7\s+[\d.]+ kB/);
    expect(compressOutput).toMatch(/\.js\s+4\s/);
  });

  it('refuses to run without a folder', () => {
    expect(() => execFileSync(process.execPath, [COMPRESS_SCRIPT], { stdio: 'pipe' })).toThrow(/Usage/);
  });
});

describe('serving the built workbench', () => {
  it('sends the brotli copy to a browser that takes br, with the raw file’s type and Vary', async () => {
    const answer = await fetchRaw('/main-ABCDEFGH.js', { 'Accept-Encoding': BROWSER_ENCODINGS });
    expect(answer.status).toBe(200);
    expect(answer.headers['content-encoding']).toBe('br');
    expect(answer.headers['content-type']?.toLowerCase()).toBe('text/javascript; charset=utf-8');
    expect(answer.headers['vary']).toMatch(/Accept-Encoding/);
    expect(answer.body.equals(builtFile('main-ABCDEFGH.js.br'))).toBe(true);
    expect(decoded(answer).equals(builtFile('main-ABCDEFGH.js'))).toBe(true);
  });

  it('prefers brotli even when the browser ranks gzip first, but never sends an encoding refused', async () => {
    const ranked = await fetchRaw('/styles-QRSTUVWX.css', { 'Accept-Encoding': 'gzip;q=1, br;q=0.5' });
    expect(ranked.headers['content-encoding']).toBe('br');
    expect(ranked.headers['content-type']?.toLowerCase()).toBe('text/css; charset=utf-8');
    const refused = await fetchRaw('/styles-QRSTUVWX.css', { 'Accept-Encoding': 'br;q=0, gzip' });
    expect(refused.headers['content-encoding']).toBe('gzip');
  });

  it('sends the gzip copy when the browser takes only gzip', async () => {
    const answer = await fetchRaw('/main-ABCDEFGH.js', { 'Accept-Encoding': 'gzip, deflate' });
    expect(answer.headers['content-encoding']).toBe('gzip');
    expect(answer.headers['content-type']?.toLowerCase()).toBe('text/javascript; charset=utf-8');
    expect(answer.headers['vary']).toMatch(/Accept-Encoding/);
    expect(decoded(answer).equals(builtFile('main-ABCDEFGH.js'))).toBe(true);
  });

  it('sends the file itself when no encoding is taken, or only identity', async () => {
    for (const headers of [
      {} as Record<string, string>,
      { 'Accept-Encoding': 'identity' },
      { 'Accept-Encoding': 'deflate' },
    ]) {
      const answer = await fetchRaw('/main-ABCDEFGH.js', headers);
      expect(answer.status).toBe(200);
      expect(answer.headers['content-encoding']).toBeUndefined();
      expect(answer.headers['vary']).toMatch(/Accept-Encoding/);
      expect(answer.body.equals(builtFile('main-ABCDEFGH.js'))).toBe(true);
    }
  });

  it('sends a file with no compressed copy as it is, whatever the browser takes', async () => {
    const answer = await fetchRaw('/chunk-RANDOM01.js', { 'Accept-Encoding': BROWSER_ENCODINGS });
    expect(answer.headers['content-encoding']).toBeUndefined();
    expect(answer.body.equals(builtFile('chunk-RANDOM01.js'))).toBe(true);
    const font = await fetchRaw('/media/roboto-latin-400-normal-ABCDEFGH.woff2', {
      'Accept-Encoding': BROWSER_ENCODINGS,
    });
    expect(font.headers['content-type']?.toLowerCase()).toBe('font/woff2');
    expect(font.headers['content-encoding']).toBeUndefined();
  });

  it('caches hashed files a year, and everything whose name stays for no time', async () => {
    for (const path of [
      '/main-ABCDEFGH.js',
      '/chunk-B_bxu6e-.js',
      '/styles-QRSTUVWX.css',
      '/media/roboto-latin-400-normal-ABCDEFGH.woff2',
    ]) {
      for (const encoding of [BROWSER_ENCODINGS, 'gzip', 'identity']) {
        const answer = await fetchRaw(path, { 'Accept-Encoding': encoding });
        expect(answer.headers['cache-control'], `${path} ${encoding}`).toBe(
          'public, max-age=31536000, immutable',
        );
      }
    }
    for (const path of [
      '/index.html',
      '/ngsw-worker.js',
      '/ngsw.json',
      '/safety-worker.js',
      '/worker-basic.min.js',
      '/color-scheme.js',
      '/manifest.webmanifest',
      '/icon-512.png',
    ]) {
      const answer = await fetchRaw(path, { 'Accept-Encoding': BROWSER_ENCODINGS });
      expect(answer.status, path).toBe(200);
      expect(answer.headers['cache-control'], path).toBe('no-cache');
    }
  });

  it('gives the manifest and the service worker’s files their own types', async () => {
    const manifest = await fetchRaw('/manifest.webmanifest');
    expect(manifest.headers['content-type']?.toLowerCase()).toBe('application/manifest+json; charset=utf-8');
    const table = await fetchRaw('/ngsw.json', { 'Accept-Encoding': BROWSER_ENCODINGS });
    expect(table.headers['content-encoding']).toBe('br');
    expect(table.headers['content-type']?.toLowerCase()).toBe('application/json; charset=utf-8');
    expect(JSON.parse(decoded(table).toString('utf8'))).toHaveProperty('hashTable');
  });

  it('answers every page of the app with index.html, compressed and never cached', async () => {
    for (const path of ['/', '/sign-in', '/jobs/42', '/machines/7/history?from=2026-01-01']) {
      const answer = await fetchRaw(path, { Accept: PAGE_ACCEPT, 'Accept-Encoding': BROWSER_ENCODINGS });
      expect(answer.status, path).toBe(200);
      expect(answer.headers['content-type']?.toLowerCase(), path).toBe('text/html; charset=utf-8');
      expect(answer.headers['content-encoding'], path).toBe('br');
      expect(answer.headers['vary'], path).toMatch(/Accept-Encoding/);
      expect(answer.headers['cache-control'], path).toBe('no-cache');
      expect(answer.headers['content-security-policy'], path).toContain("script-src 'self'");
      expect(decoded(answer).equals(builtFile('index.html')), path).toBe(true);
    }
    const plain = await fetchRaw('/jobs/42', { Accept: 'text/html' });
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body.equals(builtFile('index.html'))).toBe(true);
  });

  it('answers a file the build does not hold with a 404 problem, never with the page', async () => {
    for (const accept of [PAGE_ACCEPT, '*/*']) {
      const answer = await fetchRaw('/chunk-GONEGONE.js', {
        Accept: accept,
        'Accept-Encoding': BROWSER_ENCODINGS,
      });
      expect(answer.status).toBe(404);
      expect(answer.headers['content-type']).toMatch(/^application\/problem\+json/);
      expect(ProblemSchema.parse(JSON.parse(answer.body.toString('utf8')))).toMatchObject({
        status: 404,
        detail: 'The workbench has no file /chunk-GONEGONE.js.',
      });
    }
    const json = await fetchRaw('/jobs/42', { Accept: 'application/json' });
    expect(json.status).toBe(404);
  });

  it('lists no folder', async () => {
    for (const accept of [PAGE_ACCEPT, 'application/json']) {
      const answer = await fetchRaw('/media/', { Accept: accept });
      expect(answer.body.toString('utf8')).not.toContain('roboto');
      expect(answer.status === 404 || answer.body.equals(builtFile('index.html'))).toBe(true);
    }
  });

  it('never sends a file outside the build folder', async () => {
    for (const path of [
      '/../secret.txt',
      '/..%2fsecret.txt',
      '/%2e%2e/secret.txt',
      '/%2e%2e%2fsecret.txt',
      '/media/..%2f..%2fsecret.txt',
      '/..%5csecret.txt',
      '/main-ABCDEFGH.js%00.txt',
    ]) {
      for (const encoding of [BROWSER_ENCODINGS, 'identity']) {
        const answer = await fetchRaw(path, { Accept: '*/*', 'Accept-Encoding': encoding });
        expect(answer.status, path).not.toBe(200);
        expect(answer.status, path).toBeLessThan(500);
        expect(decoded(answer).toString('utf8'), path).not.toContain('not for the browser');
      }
    }
  });

  it('answers a malformed path with a 400 problem', async () => {
    const answer = await fetchRaw('/main-%E0%A4%A.js', { Accept: '*/*' });
    expect(answer.status).toBe(400);
    expect(answer.headers['content-type']).toMatch(/^application\/problem\+json/);
  });

  it('answers HEAD with the headers of GET and no body', async () => {
    for (const [path, accept] of [
      ['/main-ABCDEFGH.js', '*/*'],
      ['/jobs/42', PAGE_ACCEPT],
    ] as const) {
      const headers = { Accept: accept, 'Accept-Encoding': BROWSER_ENCODINGS };
      const get = await fetchRaw(path, headers);
      const head = await fetchRaw(path, headers, 'HEAD');
      expect(head.status, path).toBe(200);
      expect(head.body.length, path).toBe(0);
      for (const name of [
        'content-encoding',
        'content-type',
        'content-length',
        'cache-control',
        'vary',
        'etag',
      ]) {
        expect(head.headers[name], `${path} ${name}`).toBe(get.headers[name]);
      }
      expect(Number(head.headers['content-length'])).toBe(get.body.length);
    }
  });

  it('sends every browser its own encoding when many ask at once', async () => {
    const encodings = [BROWSER_ENCODINGS, 'gzip', 'identity', 'br', 'br;q=0, gzip;q=0.5', ''];
    const paths = ['/main-ABCDEFGH.js', '/styles-QRSTUVWX.css', '/jobs/42', '/ngsw.json'];
    const asked = Array.from({ length: 120 }, (_, i) => ({
      path: paths[i % paths.length] ?? '/',
      encoding: encodings[i % encodings.length] ?? '',
    }));
    const answers = await Promise.all(
      asked.map(({ path, encoding }) => fetchRaw(path, { Accept: PAGE_ACCEPT, 'Accept-Encoding': encoding })),
    );
    answers.forEach((answer, i) => {
      const { path, encoding } = asked[i] ?? { path: '', encoding: '' };
      const expected = { [BROWSER_ENCODINGS]: 'br', br: 'br', gzip: 'gzip', 'br;q=0, gzip;q=0.5': 'gzip' }[
        encoding
      ];
      expect(answer.status, `${path} ${encoding}`).toBe(200);
      expect(answer.headers['content-encoding'], `${path} ${encoding}`).toBe(expected);
      const file = path === '/jobs/42' ? 'index.html' : path.slice(1);
      expect(decoded(answer).equals(builtFile(file)), `${path} ${encoding}`).toBe(true);
    });
  });

  it('sends the compressed copies of a build made while the server runs', async () => {
    writeFileSync(join(buildDir, 'chunk-NEWBUILD.js'), bundle('rebuilt'));
    execFileSync(process.execPath, [COMPRESS_SCRIPT, buildDir], { stdio: 'pipe' });
    // The build writes a new index.html last.
    const later = new Date(Date.now() + 5_000);
    utimesSync(join(buildDir, 'index.html'), later, later);
    const answer = await fetchRaw('/chunk-NEWBUILD.js', { 'Accept-Encoding': BROWSER_ENCODINGS });
    expect(answer.headers['content-encoding']).toBe('br');
    expect(decoded(answer).equals(builtFile('chunk-NEWBUILD.js'))).toBe(true);
  });
});
