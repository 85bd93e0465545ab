import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type Browser, launchChromium } from './support/chromium';
import { expectAccessible } from './support/axe';
import { startServer, type TestServer, requireBuiltWorkbench } from './support/server';

/* The Widgets page: the four widgets of @counterpoise/ng as the production build serves them. */

const SCREENS_DIR = join(process.cwd(), 'test-results', 'screens');

let server: TestServer;
let browser: Browser;
let page: Page;

beforeAll(async () => {
  requireBuiltWorkbench();
  mkdirSync(SCREENS_DIR, { recursive: true });
  server = await startServer();
  browser = await launchChromium();
  page = browser.context.pages()[0] ?? (await browser.context.newPage());
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe('the Widgets page', () => {
  it('shows the four widgets, each with its accessible name', async () => {
    await page.setViewportSize({ width: 1024, height: 768 });
    await page.goto(`${server.url}/widgets`);
    for (const title of ['Phase dial', 'Correction overlay', 'Polar plot', 'Weight calculator']) {
      await page.getByRole('heading', { level: 2, name: title }).first().waitFor();
    }
    await page.getByRole('slider', { name: 'Phase of the drive-end reading' }).waitFor();
    expect(await page.locator('cp-correction-overlay svg').count()).toBeGreaterThan(0);
    expect(await page.locator('cp-polar-plot table').count()).toBe(1);
    await page.screenshot({ path: join(SCREENS_DIR, 'widgets-tablet.png') });
    await expectAccessible(page, 'the Widgets page');
  });

  it('sets the phase from the keyboard alone', async () => {
    const dial = page.getByRole('slider', { name: 'Phase of the drive-end reading' });
    await dial.focus();
    const before = await dial.getAttribute('aria-valuenow');
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('PageUp');
    const expected = String((Number(before) + 11) % 360);
    await expect.poll(() => dial.getAttribute('aria-valuenow')).toBe(expected);
    const after = expected;
    expect(await dial.getAttribute('aria-valuetext')).toMatch(/degrees, counted against rotation/);
    await page.getByText(`Phase: ${after}°`).waitFor();
    await expectAccessible(page, 'the Widgets page with the dial turned');
  });

  it('computes offline once loaded: the engine and the drawing arrive in the background', async () => {
    await page.setViewportSize({ width: 1024, height: 768 });
    await page.goto(`${server.url}/widgets`);
    const calculator = page.locator('cp-weight-calculator');
    await calculator.getByRole('heading', { name: 'Correction weight calculator' }).waitFor();
    // The on-device solver and the overlay of the result are fetched while the page is idle.
    await page.waitForLoadState('networkidle');
    await browser.context.setOffline(true);
    try {
      await calculator.locator('mat-button-toggle[data-method="single-plane"] button').click();
      const fill = async (field: string, value: string) => {
        const target = calculator.locator(
          `input[data-field="${field}"], cp-phase-dial[data-field="${field}"] input`,
        );
        await target.fill(value);
        await target.press('Tab');
      };
      await fill('initial.amplitude', '0.52');
      await fill('initial.phaseDeg', '74');
      await fill('trialWeight.mass', '60');
      await fill('trialWeight.angleDeg', '5');
      await fill('withTrial.amplitude', '0.31');
      await fill('withTrial.phaseDeg', '141');
      await calculator.getByRole('button', { name: 'Compute the correction' }).click();
      await calculator.getByText('Computed on this device.').waitFor();
      await calculator.locator('.cp-weight-calculator__results cp-correction-overlay svg').first().waitFor();
      expect(await calculator.locator('.cp-weight-calculator__overlay-missing').count()).toBe(0);
      expect(await calculator.locator('.cp-weight-calculator__mass').first().textContent()).toMatch(/\d g/);
      await page.setViewportSize({ width: 1024, height: 1600 });
      await calculator
        .locator('.cp-weight-calculator__results')
        .screenshot({ path: join(SCREENS_DIR, 'widgets-calculator-offline.png') });
      await expectAccessible(page, 'the calculator with a correction computed offline');
    } finally {
      await browser.context.setOffline(false);
    }
  });

  it('fits a phone without sideways scrolling', async () => {
    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto(`${server.url}/widgets`);
    await page.getByRole('heading', { level: 2, name: 'Weight calculator' }).first().waitFor();
    const overflow = await page.evaluate(
      () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
    );
    expect(overflow).toBeLessThanOrEqual(0);
    await page.screenshot({ path: join(SCREENS_DIR, 'widgets-phone.png') });
    await expectAccessible(page, 'the Widgets page on a phone');
  });
});
