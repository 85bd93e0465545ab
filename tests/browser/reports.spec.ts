/*
 * The service report in the browser, against the real server with its local mail server, over a fresh
 * database with the demo data: the technician opens a completed demo job, the customer draws a signature with
 * the mouse on the tablet's pad and signs, the report goes by e-mail (the address confirmed from the
 * keyboard), and the owner finds the message in the Outbox with the PDF attached, downloads it and reads the
 * job's serial number and the signer's name in it. Then the owner has a second signature taken at phone width.
 */
import { mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/src/auth/accounts.seed';
import { pdfPages } from '../../server/src/reports/reports.test-app';
import { type AccountsServer, startAccountsServer } from './support/accounts-server';
import { animationsSettled } from './support/animations';
import { expectAccessible } from './support/axe';
import { type Browser, launchChromium } from './support/chromium';
import { requireBuiltWorkbench } from './support/server';

const SCREENS_DIR = join(process.cwd(), 'test-results', 'screens');
const TABLET = { width: 820, height: 1180 };
const PHONE = { width: 390, height: 844 };
const STEP_TIMEOUT_MS = 15_000;
/** The first completed demo job: a mulcher of the demo customer, serial QS180-0612 (jobs.seed.ts). */
const JOB_ID = 1;
const SERIAL = 'QS180-0612';
const SIGNER = 'Juno Hartwell';

let server: AccountsServer;
let browser: Browser;
let page: Page;

beforeAll(async () => {
  requireBuiltWorkbench();
  mkdirSync(SCREENS_DIR, { recursive: true });
  server = await startAccountsServer();
  browser = await launchChromium();
  page = browser.context.pages()[0] ?? (await browser.context.newPage());
  page.setDefaultTimeout(STEP_TIMEOUT_MS);
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

afterEach(async (context) => {
  if (context.task.result?.state === 'fail') {
    const name = context.task.name.replace(/\W+/g, '-').slice(0, 60);
    await page
      .screenshot({ path: join(SCREENS_DIR, `report-failed-${name}.png`), fullPage: true })
      .catch((error: unknown) => console.warn('No screenshot of the failure:', error));
  }
});

async function signIn(email: string): Promise<void> {
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.getByRole('button', { name: /^Your account: / }).waitFor();
}

async function signOut(): Promise<void> {
  await page.getByRole('button', { name: /^Your account: / }).click();
  await page.getByRole('menuitem', { name: /Sign out/ }).click();
  await page.getByLabel('E-mail address').waitFor();
}

/** A screenshot of the whole page, once the spinners that end have ended, and axe on what it shows. */
async function shot(name: string): Promise<void> {
  await page.waitForTimeout(250);
  await animationsSettled(page);
  await page.screenshot({ path: join(SCREENS_DIR, `report-${name}.png`), fullPage: true });
  await expectAccessible(page, `the report's page: ${name}`);
}

/** Draws a signature on the pad with the mouse: a few loops across it, as a hand would. */
async function drawSignature(): Promise<void> {
  const pad = page.getByTestId('signature-pad');
  const box = (await pad.boundingBox())!;
  await page.mouse.move(box.x + 24, box.y + box.height * 0.6);
  await page.mouse.down();
  for (let step = 0; step <= 48; step++) {
    const x = box.x + 24 + (step * (box.width - 48)) / 48;
    const y = box.y + box.height * (0.55 + 0.22 * Math.sin(step / 2.5));
    await page.mouse.move(x, y, { steps: 2 });
  }
  await page.mouse.up();
}

describe('the service report', () => {
  it('is signed on the tablet, sent by e-mail, and opened by the owner from the Outbox', async () => {
    await page.setViewportSize(TABLET);
    await signIn('technician@ridgeline-rotor.test');
    await page.goto(`${server.url}/jobs/${JOB_ID}`);
    const panel = page.getByTestId('report-panel');
    await expect.poll(() => panel.getByTestId('report-state').textContent()).toContain('Not signed yet');
    await shot('panel-tablet');

    await panel.getByRole('button', { name: 'Customer signs' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Name of the person who signs').fill(SIGNER);
    // Sign with nothing drawn: the dialog says a drawing is needed and sends nothing.
    await dialog.getByRole('button', { name: 'Sign', exact: true }).click();
    await expect.poll(() => dialog.getByTestId('pad-error').textContent()).toContain('cannot be typed');
    await drawSignature();
    await shot('sign-tablet');
    await dialog.getByRole('button', { name: 'Sign', exact: true }).click();
    await expect
      .poll(() => panel.getByTestId('report-notice').textContent())
      .toContain(`Signed by ${SIGNER}: revision 1`);

    await panel.getByRole('button', { name: 'E-mail to the customer' }).click();
    const address = page.getByTestId('email-to');
    await expect.poll(() => address.inputValue()).toMatch(/@/);
    const to = await address.inputValue();
    await shot('email-tablet');
    // The keyboard alone sends it: Enter in the address field.
    await address.press('Enter');
    await expect.poll(() => panel.getByTestId('sendings').textContent()).toContain(to);
    await shot('sent-tablet');

    await signOut();
    await signIn('owner@ridgeline-rotor.test');
    await page.goto(`${server.url}/outbox`);
    await page
      .getByRole('link', { name: /Service report J-000001/ })
      .first()
      .click();
    const attachments = page.getByTestId('attachments');
    const button = attachments.getByRole('button', { name: /report-J-000001-r1\.pdf/ });
    await button.waitFor();
    expect(await page.getByRole('article').textContent()).toContain(to);
    await shot('outbox-tablet');
    const [download] = await Promise.all([page.waitForEvent('download'), button.click()]);
    expect(download.suggestedFilename()).toBe('report-J-000001-r1.pdf');
    const text = (await pdfPages(readFileSync((await download.path())!))).join(' ').replace(/([-/]) /g, '$1');
    expect(text).toContain(SERIAL);
    expect(text).toContain(`Signed by ${SIGNER}`);

    await page.setViewportSize(PHONE);
    await shot('outbox-phone');
  });

  it('takes a second signature at phone width as a new revision, the first still listed', async () => {
    await page.setViewportSize(PHONE);
    await page.goto(`${server.url}/jobs/${JOB_ID}`);
    const panel = page.getByTestId('report-panel');
    await expect.poll(() => panel.getByTestId('report-state').textContent()).toContain('revision 1');
    await panel.scrollIntoViewIfNeeded();
    await shot('panel-phone');
    await panel.getByRole('button', { name: 'Customer signs' }).click();
    const dialog = page.getByRole('dialog');
    await drawSignature();
    await shot('sign-phone');
    // Everything but the drawing from the keyboard: the name, then Tab past Clear and Cancel to Sign.
    const name = dialog.getByLabel('Name of the person who signs');
    await name.focus();
    await page.keyboard.type('Rowan Hartwell');
    for (let tab = 0; tab < 3; tab++) await page.keyboard.press('Tab');
    // The Sign button's text follows its icon's name ("draw").
    expect(await page.evaluate(() => document.activeElement?.textContent?.trim())).toMatch(/\bSign$/);
    await page.keyboard.press('Enter');
    await expect.poll(() => panel.getByTestId('report-notice').textContent()).toContain('revision 2');
    const revisions = await panel.getByTestId('revisions').textContent();
    expect(revisions).toContain('Revision 2');
    expect(revisions).toContain('Revision 1');
    expect(revisions).toContain('Superseded');
    await shot('signed-phone');
  });
});
