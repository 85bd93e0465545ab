import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { type Browser, launchChromium } from './support/chromium';
import { animationsSettled } from './support/animations';
import { expectAccessible } from './support/axe';
import { startServer, type TestServer, requireBuiltWorkbench } from './support/server';

/** Screenshots land here for a person to look at; the folder is ignored by git. */
const SCREENS_DIR = join(process.cwd(), 'test-results', 'screens');

const TABLET = { width: 1024, height: 768 };
const PHONE = { width: 390, height: 844 };

let server: TestServer;
let browser: Browser;
let page: Page;

beforeAll(async () => {
  requireBuiltWorkbench();
  mkdirSync(SCREENS_DIR, { recursive: true });
  server = await startServer();
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

beforeEach(async () => {
  page = browser.context.pages()[0] ?? (await browser.context.newPage());
  await page.setViewportSize(TABLET);
});

describe('the home page', () => {
  it('says what Counterpoise does, the stages of a job, and that the server works', async () => {
    await page.goto(`${server.url}/`);

    await expect(page.title()).resolves.toBe('Counterpoise');
    const heading = page.getByRole('heading', { level: 1 });
    expect(await heading.textContent()).toContain('Balance rotors in the field');
    const steps = page.getByRole('region', { name: 'A job, step by step' }).getByRole('listitem');
    expect(await steps.allInnerTexts()).toHaveLength(6);
    for (const stage of ['Inspect', 'Set up', 'Read', 'Correct', 'Verify', 'Record']) {
      await page.getByRole('heading', { level: 3, name: new RegExp(stage) }).waitFor();
    }

    const status = page.locator('.status');
    await status.getByText('Working, version 0.1.0').waitFor();
    expect(await status.textContent()).toMatch(/\d+\s+migrations? applied/);

    const safety = page.getByRole('note', { name: 'Every run, every weld' });
    expect(await safety.textContent()).toContain('local codes and licensed practice');

    await page.screenshot({ path: join(SCREENS_DIR, 'home-tablet.png') });
    await status.scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(SCREENS_DIR, 'home-tablet-status.png') });
    await expectAccessible(page, 'the home page, signed out');
  });

  it('serves its fonts from the server itself, with no request to another host', async () => {
    const foreign: string[] = [];
    page.on('request', (request) => {
      if (!request.url().startsWith(server.url) && !request.url().startsWith('data:')) {
        foreign.push(request.url());
      }
    });
    await page.goto(`${server.url}/`, { waitUntil: 'networkidle' });
    const fonts = await page.evaluate(async () => {
      await document.fonts.ready;
      return {
        roboto: document.fonts.check('16px Roboto'),
        icons: document.fonts.check('24px "Material Symbols Outlined"'),
      };
    });
    expect(fonts).toEqual({ roboto: true, icons: true });
    expect(foreign).toEqual([]);
  });

  it('works from the keyboard: skip link, then the navigation to the safety page', async () => {
    await page.goto(`${server.url}/`);
    await page.getByRole('heading', { level: 1 }).waitFor();

    await page.keyboard.press('Tab');
    const skip = page.getByRole('link', { name: 'Skip to content' });
    expect(await skip.evaluate((element) => element === document.activeElement)).toBe(true);
    await page.keyboard.press('Enter');
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('main');

    await page.getByRole('link', { name: 'Safety', exact: true }).focus();
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { level: 1, name: 'Safety' }).waitFor();
    await expect(page.title()).resolves.toBe('Safety · Counterpoise');
    const notices = page.getByRole('note');
    expect(await notices.count()).toBe(3);
    await page.screenshot({ path: join(SCREENS_DIR, 'safety-tablet.png'), fullPage: true });
    await expectAccessible(page, 'the safety page');
  });

  it('fits a phone: no sideways scrolling, and the navigation opens as a drawer', async () => {
    await page.setViewportSize(PHONE);
    await page.goto(`${server.url}/`);
    await page.getByRole('heading', { level: 1 }).waitFor();
    const overflow = await page.evaluate(
      () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
    );
    expect(overflow).toBeLessThanOrEqual(0);
    await page.screenshot({ path: join(SCREENS_DIR, 'home-phone.png'), fullPage: true });
    await expectAccessible(page, 'the home page on a phone');

    await page.getByRole('button', { name: 'Open the navigation' }).click();
    await page.getByRole('link', { name: 'Safety', exact: true }).waitFor();
    await animationsSettled(page);
    await expectAccessible(page, 'the navigation drawer open on a phone');
    await page.getByRole('link', { name: 'Safety', exact: true }).click();
    await page.getByRole('heading', { level: 1, name: 'Safety' }).waitFor();
    await page.screenshot({ path: join(SCREENS_DIR, 'safety-phone.png'), fullPage: true });
    await animationsSettled(page);
    await expectAccessible(page, 'the safety page on a phone');
  });

  it('answers a deep link with the app, and an unknown API path with a problem', async () => {
    await page.goto(`${server.url}/no/such/page`);
    await page.getByRole('heading', { name: 'There is no page at this address' }).waitFor();
    await expectAccessible(page, 'the page for an unknown address');

    const response = await fetch(`${server.url}/api/no-such-route`);
    expect(response.status).toBe(404);
    expect(response.headers.get('content-type')).toContain('application/problem+json');
  });
});
