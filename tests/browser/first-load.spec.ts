import { createHash } from 'node:crypto';
import { readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { expectAccessible } from './support/axe';
import { type Browser, launchChromium } from './support/chromium';
import { startServer, type TestServer, WORKBENCH_DIR, requireBuiltWorkbench } from './support/server';
import {
  type LoggedRequest,
  measureColdVisit,
  type TransferFigures,
  TransferLog,
  transferTable,
} from './support/transfer-log';

/**
 * The first-load budgets, measured in Chromium's own network log on a cold cache (a fresh
 * profile for each test): every byte the page's requests took over the wire, headers included.
 * 1 kB = 1,024 bytes.
 */
const KB = 1024;
const SIGN_IN_BUDGET_BYTES = 250 * KB;
/** The home page after sign-in: a cold visit to the sign-in page, signing in, and landing on the home page. */
const HOME_BUDGET_BYTES = 400 * KB;

const TECHNICIAN = 'technician@ridgeline-rotor.test';
const DEMO_PASSWORD = 'balance the drum before lunch';

let server: TestServer;

beforeAll(async () => {
  requireBuiltWorkbench();
  server = await startServer();
});

afterAll(async () => {
  await server?.stop();
});

/**
 * A page in a fresh Chromium profile: nothing cached, no service worker installed. The budgets are
 * measured with service workers blocked: every file the page needs is then fetched by the page itself and
 * counted in its own network log. With the worker allowed, it would answer some of the page's requests
 * from what it precached (bytes counted in the worker's target, not the page's), and the page's figure
 * would depend on how far the worker's install had gone; the worker's own downloads are measured apart.
 */
async function coldPage(
  serviceWorkers: 'allow' | 'block' = 'block',
): Promise<{ browser: Browser; page: Page }> {
  const browser = await launchChromium({ serviceWorkers });
  const page = browser.context.pages()[0] ?? (await browser.context.newPage());
  await page.setViewportSize({ width: 390, height: 844 });
  return { browser, page };
}

/** The size of a built file, or undefined for what the build does not hold (the API's answers). */
function builtSize(url: string): number | undefined {
  const path = new URL(url).pathname;
  try {
    return statSync(join(WORKBENCH_DIR, path)).size;
  } catch {
    return undefined;
  }
}

/**
 * Every script and style sheet came brotli-compressed, but for the few the build leaves as they are
 * because they are under 1 kB (scripts/compress-static.mjs), where headers outweigh any saving.
 */
function expectScriptsAndStylesCompressed(figures: TransferFigures): void {
  const sent = figures.log.filter((request) => request.kind === 'script' || request.kind === 'stylesheet');
  expect(sent.length).toBeGreaterThan(0);
  for (const request of sent) {
    const size = builtSize(request.url);
    expect(size, `${request.url} is a file of the build`).toBeDefined();
    expect(request.contentEncoding, `${request.url} (${size} bytes)`).toBe((size ?? 0) >= 1024 ? 'br' : '');
  }
}

/**
 * The bytes of the requests the service worker makes for itself (its install, which precaches the app's
 * files): they run in the worker's own target, not the page's, so the page's network log does not see
 * them. Playwright reports them on the context; no budget holds them, the figure is printed.
 */
function workerRequests(context: BrowserContext): { bytes: () => number; requests: () => number } {
  let bytes = 0;
  let requests = 0;
  context.on('requestfinished', (request) => {
    if (!request.serviceWorker()) return;
    requests++;
    void request.sizes().then((sizes) => {
      bytes += sizes.responseHeadersSize + sizes.responseBodySize;
    });
  });
  return { bytes: () => bytes, requests: () => requests };
}

/** Waits (a few seconds at most) for the service worker to be installed and active, if the build has one. */
async function serviceWorkerSettled(page: Page): Promise<boolean> {
  return page.evaluate(async () => {
    if (!('serviceWorker' in navigator)) return false;
    const deadline = Date.now() + 15_000;
    while (Date.now() < deadline) {
      const registration = await navigator.serviceWorker.getRegistration();
      if (registration?.active && !registration.installing && !registration.waiting) return true;
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
    return false;
  });
}

/** The requests that failed; a 401 of the session's refresh is how a visit learns that nobody is signed in. */
function failures(figures: TransferFigures): LoggedRequest[] {
  return figures.log.filter(
    (request) =>
      (request.failure !== undefined && request.failure !== 'cancelled') ||
      (request.status >= 400 && !(request.status === 401 && request.url.endsWith('/api/v1/auth/refresh'))),
  );
}

describe('the first load, on a cold cache', () => {
  it(`transfers at most ${SIGN_IN_BUDGET_BYTES / KB} kB for the sign-in page`, async () => {
    const { browser, page } = await coldPage();
    try {
      const log = await TransferLog.start(page);
      await page.goto(`${server.url}/sign-in`, { waitUntil: 'networkidle' });
      await page.getByRole('button', { name: 'Sign in', exact: true }).waitFor();
      await log.idle();
      const signIn = log.figures();
      console.log(transferTable('Sign-in page, cold cache (bytes over the wire):', signIn));

      expect(failures(signIn)).toEqual([]);
      expectScriptsAndStylesCompressed(signIn);
      expect(signIn.bytes).toBeLessThanOrEqual(SIGN_IN_BUDGET_BYTES);
      await expectAccessible(page, 'the sign-in page');
    } finally {
      await browser.close();
    }
  });

  it(`transfers at most ${HOME_BUDGET_BYTES / KB} kB for a cold visit that signs in and lands on the home page`, async () => {
    const { browser, page } = await coldPage();
    try {
      const { signInPage, added, home } = await measureColdVisit(page, server.url, {
        email: TECHNICIAN,
        password: DEMO_PASSWORD,
      });
      await page.getByRole('heading', { level: 2, name: 'Your open jobs' }).waitFor();
      console.log(
        transferTable(
          `Sign-in page: ${signInPage.requests} requests, ${signInPage.bytes} bytes. ` +
            'Signing in and landing on the home page added:',
          added,
        ),
      );
      console.log(transferTable('Home page after sign-in, cold visit in total (bytes over the wire):', home));

      expect(failures(home)).toEqual([]);
      expectScriptsAndStylesCompressed(home);
      expect(home.bytes).toBeLessThanOrEqual(HOME_BUDGET_BYTES);
      await expectAccessible(page, 'the home page after sign-in');
    } finally {
      await browser.close();
    }
  });

  it('reports what the service worker downloads for itself (its precaching, no budget)', async () => {
    const { browser, page } = await coldPage('allow');
    const worker = workerRequests(browser.context);
    try {
      const { home } = await measureColdVisit(page, server.url, {
        email: TECHNICIAN,
        password: DEMO_PASSWORD,
      });
      const settled = await serviceWorkerSettled(page);
      console.log(
        `With the service worker allowed, the page's own requests for the home page after sign-in: ` +
          `${home.requests} requests, ${home.bytes} bytes (${(home.bytes / KB).toFixed(1)} kB).`,
      );
      console.log(
        settled
          ? `The service worker's own requests (its install and precaching, in its own target): ` +
              `${worker.requests()} requests, ${worker.bytes()} bytes (${(worker.bytes() / KB).toFixed(1)} kB).`
          : 'No service worker became active within 15 s: no precaching to report.',
      );
      expect(failures(home)).toEqual([]);
      expect(home.bytes).toBeLessThanOrEqual(HOME_BUDGET_BYTES);
    } finally {
      await browser.close();
    }
  });

  it('preloads the first page’s fonts from index.html, each one the page then draws with', async () => {
    const html = await (await fetch(`${server.url}/sign-in`)).text();
    const preloaded = [...html.matchAll(/<link rel="preload" href="([^"]+)" as="font"[^>]*crossorigin/g)].map(
      (match) => `/${match[1]}`,
    );
    expect(preloaded).toHaveLength(2);
    // The build wrote index.html after Angular did: the service worker's manifest holds its new hash.
    const manifest = (await (await fetch(`${server.url}/ngsw.json`)).json()) as {
      hashTable: Record<string, string>;
    };
    expect(manifest.hashTable['/index.html']).toBe(
      createHash('sha1')
        .update(readFileSync(join(WORKBENCH_DIR, 'index.html')))
        .digest('hex'),
    );
    const { browser, page } = await coldPage();
    try {
      const fonts = new Set<string>();
      page.on('request', (request) => {
        if (request.resourceType() === 'font') fonts.add(new URL(request.url()).pathname);
      });
      await page.goto(`${server.url}/sign-in`);
      await page.getByLabel('E-mail address', { exact: true }).waitFor();
      const faces = await page.evaluate(async () => {
        await document.fonts.ready;
        return [...document.fonts]
          .filter((face) => face.status === 'loaded')
          .map((face) => `${face.family.replaceAll('"', '')} ${face.weight}`);
      });
      // Fetched once each (the preload's request is the one the style sheet uses), and nothing else.
      expect([...fonts].sort()).toEqual([...preloaded].sort());
      expect(faces.sort()).toEqual(['Roboto 400', 'Roboto 500']);
    } finally {
      await browser.close();
    }
  });

  it('is installable: Chromium finds no fault with the web app manifest', async () => {
    const { browser, page } = await coldPage();
    try {
      await page.goto(`${server.url}/sign-in`, { waitUntil: 'networkidle' });
      const session = await page.context().newCDPSession(page);
      const manifest = await session.send('Page.getAppManifest');
      expect(manifest.errors).toEqual([]);
      expect(manifest.url).toBe(`${server.url}/manifest.webmanifest`);
      const installability = await session.send('Page.getInstallabilityErrors');
      expect(installability.installabilityErrors).toEqual([]);

      const parsed = JSON.parse(manifest.data ?? '{}') as { icons: { src: string; purpose: string }[] };
      expect(parsed.icons.map((icon) => icon.purpose)).toContain('maskable');
      for (const icon of parsed.icons) {
        const answer = await page.request.get(`${server.url}/${icon.src}`);
        expect(answer.status(), icon.src).toBe(200);
      }
      const touchIcon = await page.locator('link[rel="apple-touch-icon"]').getAttribute('href');
      expect((await page.request.get(`${server.url}/${touchIcon}`)).headers()['content-type']).toBe(
        'image/png',
      );
    } finally {
      await browser.close();
    }
  });
});
