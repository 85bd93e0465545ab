/*
 * The workbench readable in sunlight and usable in gloves, against the real server over a fresh database with
 * the demo data: the technician switches to the high-contrast scheme with the keyboard alone and finds it again
 * after a reload (applied before the app starts); axe finds nothing on any step of a job in high contrast
 * (text at 7:1 there, WCAG's AAA level) nor in dark; every control on the job screens measures at least 48 × 48
 * CSS px at tablet and phone width; and the job page is pictured in each scheme for a person to look at.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/src/auth/accounts.seed';
import { animationsSettled } from './support/animations';
import { expectAccessible } from './support/axe';
import { type Browser, launchChromium } from './support/chromium';
import { startServer, type TestServer, requireBuiltWorkbench } from './support/server';

/** The job page in each scheme, for a person to look at; the folder is ignored by git. */
const SHOTS_DIR = join(process.cwd(), 'test-results', 'sunlight');
const TABLET = { width: 820, height: 1180 };
const PHONE = { width: 390, height: 844 };
/** Where the scheme is kept on the device (app/appearance/color-scheme.ts, public/color-scheme.js). */
const SCHEME_KEY = 'counterpoise.color-scheme';
/** The smallest target on the job screens, each way, in CSS px. */
const TARGET_PX = 48;

let server: TestServer;
let browser: Browser;
let page: Page;
/** The address of the demo technician's open job. */
let jobPath: string;

beforeAll(async () => {
  requireBuiltWorkbench();
  mkdirSync(SHOTS_DIR, { recursive: true });
  server = await startServer();
  browser = await launchChromium();
  page = browser.context.pages()[0] ?? (await browser.context.newPage());
  page.setDefaultTimeout(15_000);
  await page.setViewportSize(TABLET);
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel('E-mail address').fill('technician@ridgeline-rotor.test');
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.getByRole('button', { name: /^Your account: / }).waitFor();
  await page.getByRole('heading', { level: 1, name: 'Your day' }).waitFor();
  await page.getByRole('region', { name: 'Your open jobs' }).getByRole('link').first().click();
  await page.waitForURL(/\/jobs\/\d+$/);
  jobPath = new URL(page.url()).pathname;
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

/** Opens the job page with a scheme already kept on the device, as after an earlier visit. */
async function openJobIn(scheme: 'device' | 'light' | 'dark' | 'high-contrast'): Promise<void> {
  await page.evaluate(
    ([key, value]) => (value === 'device' ? localStorage.removeItem(key) : localStorage.setItem(key, value)),
    [SCHEME_KEY, scheme] as const,
  );
  await page.goto(`${server.url}${jobPath}`);
  await page.getByRole('tablist').or(page.locator('.mat-stepper-vertical')).first().waitFor();
  await animationsSettled(page);
}

/** Each step of the job in turn, opened from its header, settled. */
async function eachStep(visit: (label: string) => Promise<void>): Promise<void> {
  const headers = page.locator('app-job-page .mat-step-header');
  const count = await headers.count();
  expect(count).toBe(7);
  for (let index = 0; index < count; index++) {
    const header = headers.nth(index);
    const label = (await header.locator('.mat-step-label').innerText()).trim();
    await header.click();
    await page.getByRole('heading', { level: 2 }).first().waitFor();
    await animationsSettled(page);
    await visit(label);
  }
}

/** The page's background and text colours, as computed. */
function pageColours(): Promise<{ background: string; text: string }> {
  return page.evaluate(() => {
    const style = getComputedStyle(document.body);
    return { background: style.backgroundColor, text: style.color };
  });
}

/**
 * Every control on the job screens smaller than the target, as "what, width × height". A control is measured
 * as drawn: a button's container, a radio button's or checkbox's native input (which Material sizes to the
 * state layer, 48 px here, so Material's invisible touch target is not relied on), a text field's box, a
 * stepper header, a safety caution's title; a reading's point on the polar plot is measured with the
 * transparent hit circle the widget draws around its marker for a finger. Skipped: what is not drawn (no box,
 * hidden) and a file input kept visually hidden, out of the tab order and from screen readers, for the button
 * that opens it.
 */
function measureTargets(): Promise<{ measured: number; small: string[] }> {
  return page.evaluate((minimum) => {
    const controls = [
      'button',
      'a[href]',
      'summary',
      'input',
      'select',
      'textarea',
      '[role="button"]',
      '[role="radio"]',
      '[role="checkbox"]',
      '[role="slider"]',
      '[role="tab"]',
      '[role="combobox"]',
      '[tabindex]',
      '.mat-step-header',
      '.cp-polar-plot__point',
    ].join(', ');
    const small: string[] = [];
    let measured = 0;
    for (const root of Array.from(document.querySelectorAll('app-job-page, app-home-page .day'))) {
      for (const control of Array.from(root.querySelectorAll(controls))) {
        if (control.getAttribute('tabindex') === '-1' && control.getAttribute('aria-hidden') === 'true')
          continue;
        const textField = control.matches(
          'input:not([type="checkbox"], [type="radio"]), textarea, select, mat-select',
        )
          ? control.closest('.mat-mdc-text-field-wrapper')
          : null;
        const box = (textField ?? control).getBoundingClientRect();
        if (box.width === 0 && box.height === 0) continue;
        if (getComputedStyle(control).visibility === 'hidden') continue;
        measured++;
        if (box.width >= minimum && box.height >= minimum) continue;
        const name =
          control.getAttribute('aria-label') ??
          control.textContent?.trim().replace(/\s+/g, ' ').slice(0, 48) ??
          '';
        small.push(
          `${control.tagName.toLowerCase()} "${name}": ${Math.round(box.width)} × ${Math.round(box.height)}`,
        );
      }
    }
    return { measured, small };
  }, TARGET_PX);
}

/** A picture of the whole job page (the shell scrolls its content, so the window grows to it). */
async function picture(name: string): Promise<void> {
  const viewport = page.viewportSize() ?? TABLET;
  const height = await page.evaluate(() => {
    const main = document.querySelector('main');
    return main ? main.scrollHeight + 64 : document.body.scrollHeight;
  });
  await page.setViewportSize({
    width: viewport.width,
    height: Math.max(viewport.height, Math.min(height, 6000)),
  });
  await animationsSettled(page);
  await page.screenshot({ path: join(SHOTS_DIR, `${name}.png`) });
  await page.setViewportSize(viewport);
}

describe('the workbench in sunlight', { timeout: 180_000 }, () => {
  it('switches to high contrast with the keyboard alone, and keeps it over a reload', async () => {
    await openJobIn('device');
    expect(await page.evaluate(() => document.documentElement.hasAttribute('data-scheme'))).toBe(false);

    // From the top of the page, Tab reaches the switch in the toolbar.
    await page.locator('body').focus();
    const focusedName = () => page.evaluate(() => document.activeElement?.getAttribute('aria-label') ?? '');
    for (let tabs = 0; tabs < 12 && !(await focusedName()).startsWith('Colour scheme'); tabs++) {
      await page.keyboard.press('Tab');
    }
    expect(await focusedName()).toBe('Colour scheme: As the device');

    // Enter opens the menu on its first item, the scheme in use; the arrows go down to high contrast.
    await page.keyboard.press('Enter');
    const menu = page.getByRole('menu', { name: 'Colour scheme' });
    await menu.waitFor();
    await animationsSettled(page);
    const checked = menu.locator('[role="menuitemradio"][aria-checked="true"]');
    expect(await checked.innerText()).toContain('As the device');
    await expectAccessible(page, 'the colour scheme menu');
    for (let step = 0; step < 3; step++) await page.keyboard.press('ArrowDown');
    const focusedItem = await page.evaluate(() => document.activeElement?.textContent?.trim());
    expect(focusedItem).toBe('High contrast');
    await page.keyboard.press('Enter');
    await menu.waitFor({ state: 'detached' });

    expect(await page.evaluate(() => document.documentElement.getAttribute('data-scheme'))).toBe(
      'high-contrast',
    );
    expect(await focusedName()).toBe('Colour scheme: High contrast');
    await page.locator('.cdk-live-announcer-element').getByText('Colour scheme: High contrast').waitFor({
      state: 'attached',
    });
    expect(await pageColours()).toEqual({ background: 'rgb(255, 255, 255)', text: 'rgb(0, 0, 0)' });
    // The browser's own bar takes the toolbar's colour.
    const themeColour = () => page.locator('meta[name="theme-color"]').getAttribute('content');
    expect(await themeColour()).toBe('#003237');

    // After a reload the scheme is there before the app starts: the script in the page's head sets it
    // while the document is still being parsed, before Angular's deferred modules run.
    await page.addInitScript(() => {
      document.addEventListener('readystatechange', () => {
        if (document.readyState === 'interactive') {
          (window as unknown as { schemeBeforeApp?: string | null }).schemeBeforeApp =
            document.documentElement.getAttribute('data-scheme');
        }
      });
    });
    await page.reload();
    await page.getByRole('button', { name: 'Colour scheme: High contrast' }).waitFor();
    expect(
      await page.evaluate(() => (window as unknown as { schemeBeforeApp?: string }).schemeBeforeApp),
    ).toBe('high-contrast');
    expect(await pageColours()).toEqual({ background: 'rgb(255, 255, 255)', text: 'rgb(0, 0, 0)' });
    expect(await themeColour()).toBe('#003237');
  });

  it('passes axe on every step of the job in high contrast, text at 7:1, and in dark', async () => {
    await page.setViewportSize(TABLET);
    await openJobIn('high-contrast');
    await eachStep((step) => expectAccessible(page, `${step}, high contrast`, { enhancedContrast: true }));

    await openJobIn('dark');
    expect((await pageColours()).background).not.toBe('rgb(255, 255, 255)');
    await eachStep((step) => expectAccessible(page, `${step}, dark`));
  });

  it.each([
    { width: 'tablet', viewport: TABLET },
    { width: 'phone', viewport: PHONE },
  ])('gives every control on the job screens at least 48 × 48 px, at $width width', async ({ viewport }) => {
    await page.setViewportSize(viewport);
    await page.evaluate((key) => localStorage.removeItem(key), SCHEME_KEY);
    await page.goto(`${server.url}/`);
    await page.getByRole('heading', { level: 2, name: 'Machines due' }).waitFor();
    await page.locator('app-home-page .day .card').first().waitFor();
    const day = await measureTargets();
    expect(day.small, 'the jobs of the day').toEqual([]);
    expect(day.measured).toBeGreaterThan(3);

    await openJobIn('device');
    const small: Record<string, string[]> = {};
    await eachStep(async (step) => {
      const found = await measureTargets();
      expect(found.measured, step).toBeGreaterThan(7);
      if (found.small.length > 0) small[step] = found.small;
    });
    expect(small).toEqual({});
  });

  it('pictures the job page in each scheme at tablet and phone width', async () => {
    for (const scheme of ['light', 'dark', 'high-contrast'] as const) {
      for (const [width, viewport] of [
        ['820', TABLET],
        ['390', PHONE],
      ] as const) {
        await page.setViewportSize(viewport);
        await openJobIn(scheme);
        await picture(`job-${scheme}-${width}`);
      }
    }
    // As the device: dark when the device asks for it, with no scheme chosen.
    await page.setViewportSize(TABLET);
    await page.emulateMedia({ colorScheme: 'dark' });
    try {
      await openJobIn('device');
      const dark = await pageColours();
      await page.emulateMedia({ colorScheme: 'light' });
      expect(dark.background).not.toEqual((await pageColours()).background);
    } finally {
      await page.emulateMedia({ colorScheme: null });
    }
  });
});
