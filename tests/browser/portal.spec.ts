/*
 * The developer portal in the browser: the demo owner creates a key, the test calls the calculator with it
 * (good calls, refused bodies and a batch, over real HTTP), and the portal shows those requests,
 * calculations and errors in its chart's data and its table, the same numbers in both; the span and the
 * grouping are changed from the keyboard alone, kept in the address over a reload, and the quick start's
 * command works once the whole key is put in place of its prefix. axe on every state, at 1024 and 390 px.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CALC_ROUTES } from '@counterpoise/api';
import { DEMO_PASSWORD } from '../../server/src/auth/accounts.seed';
import { animationsSettled } from './support/animations';
import { expectAccessible } from './support/axe';
import { type Browser, launchChromium } from './support/chromium';
import { requireBuiltWorkbench, startServer, type TestServer } from './support/server';

const SCREENS_DIR = join(process.cwd(), 'test-results', 'screens');
const KEY_NAME = 'Harbour dealer portal';

let server: TestServer;
let browser: Browser;
let page: Page;

beforeAll(async () => {
  requireBuiltWorkbench();
  mkdirSync(SCREENS_DIR, { recursive: true });
  server = await startServer();
  browser = await launchChromium();
  page = browser.context.pages()[0] ?? (await browser.context.newPage());
  await page.setViewportSize({ width: 1024, height: 900 });
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

/** One call to the calculator with a key, as a dealer's program makes it; answers its status and body. */
async function call(key: string, route: string, body: unknown): Promise<{ status: number; body: unknown }> {
  const response = await fetch(`${server.url}/api/v1/calc/${route}`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', 'X-Api-Key': key },
    body: JSON.stringify(body),
  });
  return { status: response.status, body: await response.json() };
}

/** The usage table's figures of the row whose first cell is `label`. */
async function tableRow(label: string): Promise<{ requests: number; calculations: number; errors: string }> {
  const table = page.getByRole('table', { name: /^Usage by / });
  const row = table.getByRole('row').filter({ has: page.getByRole('cell', { name: label, exact: true }) });
  const cells = await row.getByRole('cell').allInnerTexts();
  return { requests: Number(cells[1]), calculations: Number(cells[2]), errors: cells[3]!.trim() };
}

/** What the chart draws, as its host publishes it. */
async function chartSeries(): Promise<{
  labels: string[];
  requests: number[];
  calculations: number[];
  errors: number[];
}> {
  const chart = page.locator('app-usage-chart');
  await chart.locator('canvas').waitFor();
  return JSON.parse((await chart.getAttribute('data-series'))!);
}

/** Waits for the usage to be fetched again after a change, and for the table or the empty sentence. */
async function usageShown(): Promise<void> {
  await page.getByRole('progressbar', { name: 'Fetching the usage' }).waitFor({ state: 'detached' });
  await page
    .getByRole('table', { name: /^Usage by / })
    .or(page.getByText(/^No requests with the organisation/))
    .first()
    .waitFor();
}

/** Presses Tab until `target` has the focus (at most `limit` times), as a keyboard user moves through a page. */
async function tabTo(target: Locator, limit = 40): Promise<void> {
  for (let presses = 0; presses < limit; presses++) {
    if (await target.evaluate((element) => element === document.activeElement)) return;
    await page.keyboard.press('Tab');
  }
  throw new Error(`Tab never reached ${String(target)}`);
}

describe('the developer portal', () => {
  let key = '';
  let prefix = '';

  it('creates a key in the workbench, shown once', async () => {
    await page.goto(`${server.url}/sign-in`);
    await page.getByLabel('E-mail address').fill('owner@ridgeline-rotor.test');
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in', exact: true }).click();
    await page.getByRole('button', { name: /^Your account: / }).waitFor();
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'API keys' }).click();
    await page.getByRole('heading', { level: 1, name: 'API keys' }).waitFor();
    await page.getByRole('heading', { level: 2, name: 'Usage' }).waitFor();

    await page.getByRole('button', { name: 'Create a key' }).click();
    const dialog = page.getByRole('dialog', { name: 'Create an API key' });
    await dialog.getByLabel('Name').fill(KEY_NAME);
    await dialog.getByLabel('Limit, calculations per minute (optional)').fill('120');
    await expectAccessible(page, 'the key creation dialog, filled in');
    await dialog.getByRole('button', { name: 'Create the key' }).click();
    const shown = page.getByRole('dialog', { name: 'Your new key' });
    // The focus moves on to the next step, and stays there once the dialog has placed its own.
    await shown.getByRole('button', { name: 'Copy the key' }).waitFor();
    await page.waitForTimeout(300);
    expect(await page.evaluate(() => document.activeElement?.textContent?.trim())).toBe('Copy the key');
    key = await shown.getByRole('textbox').inputValue();
    expect(key).toMatch(/^cpk_[A-Za-z0-9_-]{43}$/);
    prefix = key.slice(0, 12);
    await shown.getByRole('button', { name: 'I have kept the key' }).click();
    await shown.waitFor({ state: 'detached' });
    await page.getByRole('table', { name: 'API keys' }).getByText(KEY_NAME).waitFor();
    // Shown once: nowhere on the page after the dialog closed.
    expect(await page.content()).not.toContain(key);
  });

  it('shows the key’s requests, calculations and errors in the chart and the table, the same in both', async () => {
    const good = CALC_ROUTES['single-plane'].example;
    const refused = { initial: good.initial, trialWeight: good.trialWeight };
    const answers = await Promise.all([
      ...Array.from({ length: 5 }, () => call(key, 'single-plane', good)),
      ...Array.from({ length: 2 }, () => call(key, 'single-plane', refused)),
      call(key, 'batch', {
        items: [
          { route: 'single-plane', body: good },
          { route: 'radius', body: CALC_ROUTES.radius.example },
          { route: 'radius', body: { mass: 1, fromRadius: 1, toRadius: -1 } },
        ],
      }),
    ]);
    expect(answers.map((answer) => answer.status)).toEqual([200, 200, 200, 200, 200, 400, 400, 200]);
    const items = (answers[7]!.body as { items: { status: number }[] }).items.map((item) => item.status);
    expect(items).toEqual([200, 200, 400]);
    // 8 requests, 10 calculations (the batch of three counts three), 3 refused answers (two calls, one item).
    // The usage log writes within a tenth of a second; the page asks again on a reload.
    await new Promise((resolve) => setTimeout(resolve, 500));
    await page.reload();
    await page.getByRole('heading', { level: 2, name: 'Usage' }).waitFor();
    await usageShown();

    // By key, from the keyboard: the toggle group takes the focus, an arrow moves to the next, Space picks it.
    const byDay = page.getByRole('radio', { name: 'By day' });
    await byDay.focus();
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('ArrowRight');
    await expect
      .poll(() =>
        page.getByRole('radio', { name: 'By key' }).evaluate((element) => element === document.activeElement),
      )
      .toBe(true);
    await page.keyboard.press('Space');
    await expect.poll(() => new URL(page.url()).searchParams.get('by')).toBe('key');
    await usageShown();

    const label = `${KEY_NAME} (${prefix}…)`;
    expect(await tableRow(label)).toEqual({
      requests: 8,
      calculations: 10,
      errors: '3: 400 Bad request ×3',
    });
    const series = await chartSeries();
    const at = series.labels.indexOf(label);
    expect(at).toBeGreaterThanOrEqual(0);
    expect([series.requests[at], series.calculations[at], series.errors[at]]).toEqual([8, 10, 3]);
    // The whole table against the whole chart, line for line.
    for (const [index, line] of series.labels.entries()) {
      const row = await tableRow(line);
      expect([row.requests, row.calculations], line).toEqual([
        series.requests[index],
        series.calculations[index],
      ]);
    }
    await expectAccessible(page, 'the portal’s usage by key');
    // The shell scrolls inside its frame: a tall window shows the whole page. A tablet held upright, 820 px.
    await page.setViewportSize({ width: 820, height: 2300 });
    await page.getByRole('table', { name: 'Usage by key' }).waitFor();
    await page.screenshot({ path: join(SCREENS_DIR, 'portal-by-key-820.png') });
    await expectAccessible(page, 'the portal’s usage by key at 820 px');
    await page.setViewportSize({ width: 1024, height: 900 });
  });

  it('changes the span from the keyboard, keeps it in the address over a reload', async () => {
    const lastWeek = page.getByRole('button', { name: 'Last 7 days' });
    await tabTo(lastWeek);
    await page.keyboard.press('Enter');
    await expect.poll(() => lastWeek.getAttribute('aria-pressed')).toBe('true');
    await usageShown();
    const today = new Date().toISOString().slice(0, 10);
    expect(new URL(page.url()).searchParams.get('to')).toBe(today);

    // A span typed into the range: a month long ago, with nothing in it.
    const first = page.getByRole('textbox', { name: 'First day' });
    await tabTo(first);
    await page.keyboard.press('ControlOrMeta+A');
    await page.keyboard.type('3/1/2025');
    await page.keyboard.press('Tab');
    await page.keyboard.press('ControlOrMeta+A');
    await page.keyboard.type('3/31/2025');
    await page.keyboard.press('Tab');
    await expect
      .poll(() => {
        const params = new URL(page.url()).searchParams;
        return [params.get('from'), params.get('to'), params.get('by')];
      })
      .toEqual(['2025-03-01', '2025-03-31', 'key']);
    await page.getByText(/^No requests with the organisation.s keys in this span\.$/).waitFor();
    await expectAccessible(page, 'the portal’s usage of an empty span');

    await page.reload();
    await page.getByText(/^No requests with the organisation.s keys in this span\.$/).waitFor();
    expect(await page.getByRole('textbox', { name: 'First day' }).inputValue()).toBe('3/1/2025');
    expect(await page.getByRole('radio', { name: 'By key' }).getAttribute('aria-checked')).toBe('true');

    // Back to the last 30 days, by day: today's line holds all of the key's calls.
    await page.getByRole('button', { name: 'Last 30 days' }).click();
    await page.getByRole('radio', { name: 'By day' }).click();
    await usageShown();
    const series = await chartSeries();
    expect(series.labels).toHaveLength(30);
    const todayLabel = new Intl.DateTimeFormat('en-GB', {
      day: 'numeric',
      month: 'short',
      timeZone: 'UTC',
    }).format(new Date());
    const row = await tableRow(todayLabel);
    expect(series.requests.at(-1)).toBe(row.requests);
    expect(row.requests).toBeGreaterThanOrEqual(8);
  });

  it('gives a quick start command that works once the whole key is put in', async () => {
    await page.getByRole('combobox', { name: 'Key' }).click();
    await page.getByRole('option', { name: new RegExp(KEY_NAME) }).click();
    const command = (
      await page.getByRole('region', { name: 'Quick start' }).locator('pre').innerText()
    ).trim();
    expect(command).toContain(`X-Api-Key: ${prefix}…`);
    expect(command).not.toContain(key);
    const url = /curl -X POST '([^']+)'/.exec(command)?.[1];
    const body = /-d '([^']+)'/.exec(command)?.[1];
    expect(url).toBe(`${server.url}/api/v1/calc/single-plane`);
    const answer = await fetch(url!, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'X-Api-Key': key },
      body: body!,
    });
    expect(answer.status).toBe(200);
    expect(((await answer.json()) as { correction: { mass: number } }).correction.mass).toBeGreaterThan(0);
    await expectAccessible(page, 'the portal’s quick start');
  });

  it('fits a phone, with every figure still readable', async () => {
    await page.setViewportSize({ width: 390, height: 844 });
    await page.getByRole('radio', { name: 'By key' }).click();
    await usageShown();
    await animationsSettled(page);
    const table = page.getByRole('table', { name: 'Usage by key' });
    const line = table.getByRole('row').filter({ hasText: KEY_NAME });
    expect((await line.innerText()).replace(/\s+/g, ' ')).toMatch(
      // The quick start's command made one more request, one more calculation.
      /Requests 9 Calculations 11 Errors 3: 400 Bad request ×3/,
    );
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await page.setViewportSize({ width: 390, height: 2600 });
    await page.screenshot({ path: join(SCREENS_DIR, 'portal-phone.png') });
    await page.setViewportSize({ width: 390, height: 844 });
    await expectAccessible(page, 'the portal on a phone');
  });
});
