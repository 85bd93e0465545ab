/*
 * The shop's records in the browser, against the real server over a fresh database with the demo data: a
 * technician adds a customer and a machine for it, marks the machine's allowed positions on the correction
 * overlay with the keyboard and a blocked sector with taps, saves, and finds the machine again by its serial
 * number, on a tablet and at phone width.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  pointAtAngle,
  type RotationDirection,
  type RotationCounting,
} from '../../projects/counterpoise/core/dial-geometry';
import { DEMO_PASSWORD } from '../../server/src/auth/accounts.seed';
import { type Browser, launchChromium } from './support/chromium';
import { expectAccessible } from './support/axe';
import { startServer, type TestServer, requireBuiltWorkbench } from './support/server';

const SCREENS_DIR = join(process.cwd(), 'test-results', 'screens');
const TABLET = { width: 800, height: 1280 };
const PHONE = { width: 390, height: 844 };

/** Invented for this test: a customer of the demo shop and its machine. */
const CUSTOMER = { name: 'Larchfield Haulage Co-operative', email: 'workshop@larchfield.example.com' };
const SERIAL = 'LHC-FM-0042';

let server: TestServer;
let browser: Browser;
let page: Page;

beforeAll(async () => {
  requireBuiltWorkbench();
  mkdirSync(SCREENS_DIR, { recursive: true });
  server = await startServer();
  browser = await launchChromium();
  page = browser.context.pages()[0] ?? (await browser.context.newPage());
  await page.setViewportSize(TABLET);
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

/** Follows an entry of the main navigation, opening it first where it folds away (below 840 px). */
async function navigateTo(label: string): Promise<void> {
  const menu = page.getByRole('button', { name: 'Open the navigation' });
  if (await menu.isVisible()) await menu.click();
  await page
    .getByRole('navigation', { name: 'Main' })
    .getByRole('link', { name: label, exact: true })
    .click();
}

async function signInAsTechnician(): Promise<void> {
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel('E-mail address').fill('technician@ridgeline-rotor.test');
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.getByRole('button', { name: /^Your account: / }).waitFor();
}

/** The plane editor of the left (first) plane. */
const leftPlane = () => page.locator('app-plane-editor').first();

/** Where on the screen a rotor angle of a drawn plane is, from what the drawing says of itself. */
async function screenPointOf(plane: Locator, angleDeg: number, radiusFraction: number) {
  const drawing = plane.locator('svg.cp-correction-overlay__drawing');
  const [data, box] = await Promise.all([
    drawing.evaluate((svg) => ({
      cx: Number(svg.getAttribute('data-center-x')),
      cy: Number(svg.getAttribute('data-center-y')),
      radius: Number(svg.getAttribute('data-radius')),
      zero: Number(svg.getAttribute('data-zero-at-deg')),
      rotation: svg.getAttribute('data-rotation') as RotationDirection,
      counting: svg.getAttribute('data-counting') as RotationCounting,
      width: Number(svg.getAttribute('viewBox')?.split(' ')[2]),
    })),
    drawing.boundingBox(),
  ]);
  if (!box) throw new Error('The drawing is not on screen.');
  const point = pointAtAngle({ x: data.cx, y: data.cy }, data.radius * radiusFraction, angleDeg, {
    rotation: data.rotation,
    counting: data.counting,
    zeroAtDeg: data.zero,
  });
  const scale = box.width / data.width;
  return { x: box.x + point.x * scale, y: box.y + point.y * scale };
}

/** A finger's tap on the screen, as a tablet sends it (touch events, then the click the browser makes of them). */
async function tap(point: { x: number; y: number }): Promise<void> {
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Emulation.setTouchEmulationEnabled', { enabled: true, maxTouchPoints: 1 });
  await cdp.send('Input.dispatchTouchEvent', {
    type: 'touchStart',
    touchPoints: [{ x: point.x, y: point.y }],
  });
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
  await cdp.send('Emulation.setTouchEmulationEnabled', { enabled: false });
  await cdp.detach();
}

describe('the shop’s records in the workbench', () => {
  it('lets a technician add a customer and a machine, its layout drawn by keyboard and by tap', async () => {
    await signInAsTechnician();
    await navigateTo('Customers');
    await page.getByRole('heading', { level: 1, name: 'Customers' }).waitFor();
    await page.getByRole('table', { name: 'Customers' }).getByRole('row').nth(1).waitFor();
    await page.screenshot({ path: join(SCREENS_DIR, 'records-customers-tablet.png'), fullPage: true });
    await expectAccessible(page, 'the customers');

    await page.getByRole('link', { name: 'Add a customer' }).click();
    await page.getByRole('heading', { level: 1, name: 'Add a customer' }).waitFor();
    await page.getByLabel('Name', { exact: true }).fill(CUSTOMER.name);
    await page.getByLabel('E-mail address', { exact: true }).fill(CUSTOMER.email);
    await expectAccessible(page, 'the new customer’s form, filled in');
    await page.getByRole('button', { name: 'Add the customer' }).click();
    await page.getByRole('heading', { level: 1, name: CUSTOMER.name }).waitFor();
    expect(page.url()).toMatch(/\/customers\/\d+$/);
    await page.getByText('Tomasz Wrenfield added this customer.').waitFor();
    await expectAccessible(page, 'the customer just added');

    await page.getByRole('link', { name: 'Add a machine' }).click();
    await page.getByRole('heading', { level: 1, name: 'Add a machine' }).waitFor();
    await expect.poll(() => page.getByLabel(/^Customer/).inputValue()).toBe(CUSTOMER.name);
    await page.getByLabel('Serial number').fill(SERIAL);
    await page.getByLabel('Make').fill('Thornmill');
    for (const radius of await page.getByLabel('Correction radius').all()) await radius.fill('240');

    // Allowed positions with the keyboard: the overlay's crosshair turned to 20 degrees and marked with Enter.
    const crosshair = leftPlane().getByRole('button', { name: 'Crosshair: mark a point on the rotor' });
    await crosshair.focus();
    for (let step = 0; step < 20; step++) await page.keyboard.press('ArrowRight');
    await page.keyboard.press('Enter');
    await leftPlane().getByText('Marked: 20° from the reference mark.').waitFor();
    await leftPlane().getByRole('button', { name: 'Set first position here' }).focus();
    await page.keyboard.press('Enter');
    expect(await leftPlane().getByLabel('Positions', { exact: true }).inputValue()).toBe('12');
    expect(await leftPlane().getByLabel('First position at', { exact: true }).inputValue()).toBe('20');

    // A blocked sector with two taps on the drawing.
    await tap(await screenPointOf(leftPlane(), 100, 0.85));
    await leftPlane().getByText('Marked: 100° from the reference mark.').waitFor();
    await leftPlane().getByRole('button', { name: 'Start a blocked sector here' }).click();
    await tap(await screenPointOf(leftPlane(), 130, 0.85));
    await leftPlane().getByText('Marked: 130° from the reference mark.').waitFor();
    await leftPlane().getByRole('button', { name: 'End the sector here' }).click();
    // The field of what blocks it takes the focus once drawn, so the technician types straight away.
    const blocker = leftPlane().getByLabel('What blocks it', { exact: true });
    await expect.poll(() => blocker.evaluate((field) => field === document.activeElement)).toBe(true);
    await page.keyboard.type('holder');
    expect(await leftPlane().getByLabel('From', { exact: true }).inputValue()).toBe('100');
    expect(await leftPlane().getByLabel('To', { exact: true }).inputValue()).toBe('130');
    const words = leftPlane().locator('.cp-correction-overlay__description');
    await words.getByText('12 allowed positions, every 30 degrees from 20 degrees.').waitFor();
    await words.getByText('Blocked: holder 100 to 130 degrees.').waitFor();
    await leftPlane().scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(SCREENS_DIR, 'records-machine-form-tablet.png') });
    await expectAccessible(page, 'the new machine’s form with its layout drawn');

    await page.getByRole('button', { name: 'Add the machine' }).click();
    await page.getByRole('heading', { level: 1, name: new RegExp(SERIAL) }).waitFor();
    const leftDrawing = page.getByRole('figure').first().locator('.cp-correction-overlay__description');
    await leftDrawing.getByText('Blocked: holder 100 to 130 degrees.').waitFor();
    await page.getByText('Tomasz Wrenfield added this machine.').waitFor();
    await page.screenshot({ path: join(SCREENS_DIR, 'records-machine-tablet.png'), fullPage: true });
    await expectAccessible(page, 'the machine just added');
  });

  it('finds the machine again by its serial number, on a tablet and at phone width', async () => {
    for (const [size, name] of [
      [TABLET, 'tablet'],
      [PHONE, 'phone'],
    ] as const) {
      await page.setViewportSize(size);
      await page.goto(`${server.url}/machines`);
      await page.getByRole('heading', { level: 1, name: 'Machines' }).waitFor();
      await page.getByRole('searchbox', { name: 'Search machines' }).fill(SERIAL);
      await page.waitForURL(new RegExp(`/machines\\?q=${SERIAL}$`));
      const table = page.getByRole('table', { name: 'Machines' });
      await table.getByRole('link', { name: SERIAL }).waitFor();
      await expect.poll(() => table.getByRole('row').count()).toBe(2);
      await page.screenshot({
        path: join(SCREENS_DIR, `records-machines-found-${name}.png`),
        fullPage: true,
      });
      await expectAccessible(page, `the machines found, ${name}`);
      await table.getByRole('link', { name: SERIAL }).click();
      await page.getByRole('heading', { level: 1, name: new RegExp(SERIAL) }).waitFor();
      // The search survives the way back.
      await page.goBack();
      expect(await page.getByRole('searchbox', { name: 'Search machines' }).inputValue()).toBe(SERIAL);
    }
  });
});
