/*
 * Keys fit for a browser, in a real browser: Chromium loads a portal's page from one origin and calls the
 * API on another, with a key limited to the portal's origin and with a visitor token bound to it. The
 * browser itself sends the preflight and the Origin header and enforces CORS, so what passes here is what
 * a dealer's page gets.
 */
import { randomBytes } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/src/app';
import { ApiKeysRepo } from '../../server/src/keys/keys.repo';
import { ApiKeyService } from '../../server/src/keys/keys.service';
import { openTemporaryDatabase, type TemporaryDatabase } from '../../server/src/testing/temporary-database';
import { UsageLog } from '../../server/src/usage/usage-log';
import { type Browser, launchChromium } from './support/chromium';

let temporary: TemporaryDatabase;
let usageLog: UsageLog;
let browser: Browser;
const servers: Server[] = [];
let api: string;
/** The dealer's portal, whose origin the key lists. */
let portal: string;
/** Another site, which copied the key out of the portal's page. */
let copycat: string;
let browserKey: string;
let secretKey: string;
let keyIds: { browser: number; secret: number };

/** Listens on a free port of 127.0.0.1 and answers its address. */
async function listen(server: Server, host = '127.0.0.1'): Promise<string> {
  servers.push(server);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return `http://${host}:${(server.address() as AddressInfo).port}`;
}

/** A site whose one page is blank: the test runs the page's script itself. */
const blankSite = () =>
  createServer((_req, res) => {
    res.writeHead(200, { 'Content-Type': 'text/html; charset=utf-8' });
    res.end('<!doctype html><html lang="en"><title>Portal</title><main>Portal</main></html>');
  });

beforeAll(async () => {
  temporary = openTemporaryDatabase();
  usageLog = new UsageLog(temporary.database, { log: () => undefined });
  const app = createApp({
    database: temporary.database,
    usageLog,
    log: () => undefined,
    accounts: { signingKey: randomBytes(48), passwordHashCost: 10 },
  });
  api = await listen(createServer(app));
  portal = await listen(blankSite());
  // Another origin on the same computer: `localhost` is not `127.0.0.1` to a browser.
  copycat = await listen(blankSite(), 'localhost');
  const keys = new ApiKeyService(new ApiKeysRepo(temporary.database.orm));
  const limited = keys.create(
    { name: 'Portal pages', limitPerMinute: 60, allowedOrigins: [portal] },
    new Date(),
  );
  const secret = keys.create({ name: 'Portal back end', limitPerMinute: 600 }, new Date());
  browserKey = limited.key;
  secretKey = secret.key;
  keyIds = { browser: limited.record.id, secret: secret.record.id };
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
  await Promise.all(servers.map((server) => new Promise((resolve) => server.close(resolve))));
  usageLog?.close();
  temporary?.dispose();
});

/** What a page's fetch of the radius calculator got: the answer, or the browser's refusal. */
type Outcome =
  { status: number; mass?: number; code?: string; remaining: string | null } | { failed: string };

async function calcFrom(page: Page, headers: Record<string, string>): Promise<Outcome> {
  return page.evaluate(
    async ({ url, headers }) => {
      try {
        const response = await fetch(`${url}/api/v1/calc/radius`, {
          method: 'POST',
          headers: { 'Content-Type': 'application/json', ...headers },
          body: JSON.stringify({ mass: 120, fromRadius: 180, toRadius: 240 }),
        });
        const body = (await response.json()) as { mass?: number; code?: string };
        return {
          status: response.status,
          ...(body.mass === undefined ? {} : { mass: body.mass }),
          ...(body.code === undefined ? {} : { code: body.code }),
          remaining: response.headers.get('RateLimit-Remaining'),
        };
      } catch (error) {
        return { failed: String(error) };
      }
    },
    { url: api, headers },
  );
}

async function openPage(origin: string): Promise<Page> {
  const page = await browser.context.newPage();
  await page.goto(`${origin}/`);
  return page;
}

describe('a key limited to the portal’s origin, in Chromium', () => {
  it('calculates from the portal’s page, which reads the answer and its rate-limit headers', async () => {
    const page = await openPage(portal);
    const outcome = await calcFrom(page, { 'X-Api-Key': browserKey });
    expect(outcome).toEqual({ status: 200, mass: 90, remaining: '59' });
    await page.close();
  });

  it('is stopped from another site’s page', async () => {
    const page = await openPage(copycat);
    const outcome = await calcFrom(page, { 'X-Api-Key': browserKey });
    // No key lists the copycat's origin, so the browser stops at the preflight and the page learns nothing.
    expect(outcome).toMatchObject({ failed: expect.stringMatching(/Failed to fetch/) });
    await page.close();
    usageLog.flush();
    const calls = temporary.database.sqlite
      .prepare('SELECT status FROM api_usage WHERE key_id = ?')
      .pluck()
      .all(keyIds.browser);
    expect(calls).toEqual([200]);
  });
});

describe('a visitor token bound to the portal’s origin, in Chromium', () => {
  async function exchange(origin: string): Promise<string> {
    const answer = await fetch(`${api}/api/v1/tokens`, {
      method: 'POST',
      headers: { 'X-Api-Key': secretKey, 'Content-Type': 'application/json' },
      body: JSON.stringify({ origin, visitor: 'customer-1187', ttlSeconds: 120 }),
    });
    expect(answer.status).toBe(201);
    return ((await answer.json()) as { token: string }).token;
  }

  it('calculates from the portal’s page as its key, and is refused from another site', async () => {
    const token = await exchange(portal);
    const page = await openPage(portal);
    expect(await calcFrom(page, { Authorization: `Bearer ${token}` })).toEqual({
      status: 200,
      mass: 90,
      remaining: '598',
    });
    await page.close();

    // A token bound to the portal, copied to another site whose origin a live token happens to name:
    // the preflight passes, the request is refused, and that page can read why.
    await exchange(copycat);
    const elsewhere = await openPage(copycat);
    expect(await calcFrom(elsewhere, { Authorization: `Bearer ${token}` })).toEqual({
      status: 403,
      code: 'API_KEY_ORIGIN_REFUSED',
      remaining: null,
    });
    await elsewhere.close();
  });
});
