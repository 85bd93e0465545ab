/*
 * Working with no connection, in the browser against the real server over a fresh database with the demo
 * data: a technician starts a job online, loses the connection (Chromium's offline mode), types the initial
 * run, has the correction worked out on the device and records the weights fitted, reloads the page while
 * still offline (the app comes back from the service worker with everything typed), and once the connection
 * returns the device sends its queue by itself: the server stores the run, its own correction (which agrees
 * with the device's) and the weights fitted.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { animationsSettled } from './support/animations';
import { expectAccessible } from './support/axe';
import { type Browser, launchChromium } from './support/chromium';
import {
  firstSteps,
  PHONE,
  serviceWorkerReady,
  signIn,
  startJobOn,
  stepOpens,
  storedJob,
  TABLET,
  TECHNICIAN,
  typeInitialRun,
} from './support/offline-job';
import { startServer, type TestServer, requireBuiltWorkbench } from './support/server';

const SCREENS_DIR = join(process.cwd(), 'test-results', 'screens');
const STEP_TIMEOUT_MS = 15_000;

let server: TestServer;
let browser: Browser;
let page: Page;

beforeAll(async () => {
  requireBuiltWorkbench();
  mkdirSync(SCREENS_DIR, { recursive: true });
  server = await startServer();
  browser = await launchChromium();
  page = browser.context.pages()[0] ?? (await browser.context.newPage());
  page.setDefaultTimeout(STEP_TIMEOUT_MS);
  await page.setViewportSize(TABLET);
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

afterEach(async (context) => {
  if (context.task.result?.state === 'fail') {
    await page
      .screenshot({ path: join(SCREENS_DIR, 'offline-failed.png'), fullPage: true })
      .catch((error: unknown) => console.warn('No screenshot of the failure:', error));
  }
  await page.context().setOffline(false);
});

/** The shell's status of the connection. */
function connectionStatus(on: Page) {
  return on.getByRole('link', { name: /^Connection: / });
}

/** What the status says, as its label reads it out: "Online", "Offline · 3 waiting", "1 conflict"… */
async function statusOf(on: Page): Promise<string> {
  const label = (await connectionStatus(on).getAttribute('aria-label')) ?? '';
  return /^Connection: (.*)\. Changes kept on this device$/.exec(label)?.[1] ?? label;
}

/** Takes a screenshot of the page at a width, the window grown to the page's content. */
async function shoot(on: Page, name: string, viewport: { width: number; height: number }): Promise<void> {
  await on.setViewportSize(viewport);
  await animationsSettled(on);
  const height = await on.evaluate(() => {
    const main = document.querySelector('main');
    return main ? main.scrollHeight + 64 : document.body.scrollHeight;
  });
  await on.setViewportSize({
    width: viewport.width,
    height: Math.max(viewport.height, Math.min(height, 6000)),
  });
  await on.screenshot({ path: join(SCREENS_DIR, `${name}.png`) });
  await on.setViewportSize(TABLET);
}

/** Whether the device keeps a read answer at this address (in its IndexedDB). */
async function keptOnDevice(on: Page, url: string): Promise<boolean> {
  return on.evaluate(
    (wanted) =>
      new Promise<boolean>((resolve) => {
        const opening = indexedDB.open('counterpoise-offline');
        opening.onsuccess = () => {
          const all = opening.result.transaction('records').objectStore('records').getAll();
          all.onsuccess = () => resolve((all.result as { url: string }[]).some((r) => r.url === wanted));
          all.onerror = () => resolve(false);
        };
        opening.onerror = () => resolve(false);
      }),
    url,
  );
}

describe('a job with no connection', { timeout: 180_000 }, () => {
  it('keeps the readings, the correction and the weights fitted offline, across a reload, and sends them when the connection returns', async () => {
    await signIn(page, server.url, TECHNICIAN);
    const jobId = await startJobOn(page, server.url, 'QS180-0457');
    await firstSteps(page);
    await serviceWorkerReady(page);
    const { job: online } = await storedJob(server.url, jobId);
    // What the local rules need was kept while online: the job, its machine and its family.
    await expect.poll(() => keptOnDevice(page, `/api/v1/jobs/${jobId}`)).toBe(true);
    await expect.poll(() => keptOnDevice(page, `/api/v1/machines/${online.machine.id}`)).toBe(true);
    await expect
      .poll(() => keptOnDevice(page, `/api/v1/machine-families/${online.machine.familyId}`))
      .toBe(true);

    await page.context().setOffline(true);
    await expect.poll(() => statusOf(page)).toMatch(/^Offline/);

    // The initial run, typed and saved with no connection: kept on the device, the job goes on.
    await typeInitialRun(page);
    await page.getByRole('button', { name: 'Save the initial run' }).click();
    await page.getByText(/Saved on this device, waiting to be sent/).waitFor();
    await stepOpens(page, 'Correction');
    await expect.poll(() => statusOf(page)).toMatch(/Offline · 1 waiting/);

    // The correction worked out on the device, by the same rules as the server's, and the weights fitted.
    await page.getByRole('radio', { name: /Stored sensitivity, one run/ }).check();
    await page.getByRole('button', { name: 'Work it out' }).click();
    await page.getByRole('table', { name: 'The weights to add now, per plane' }).waitFor();
    await expectAccessible(page, 'the correction worked out offline');
    await shoot(page, 'offline-1-correction-tablet', TABLET);
    await shoot(page, 'offline-1-correction-phone', PHONE);
    await page.getByRole('button', { name: 'Fill in the plan' }).click();
    await page.getByRole('button', { name: 'Record what was fitted' }).click();
    await stepOpens(page, 'Verification');
    await expect.poll(() => statusOf(page)).toMatch(/Offline · 3 waiting/);

    // A reload with no connection: the app comes back from the service worker, with the queue and the job as
    // it will be.
    await page.reload();
    await stepOpens(page, 'Verification');
    await expect.poll(() => statusOf(page)).toMatch(/Offline · 3 waiting/);
    await page.getByText(/3 changes of this job wait on this device to be sent/).waitFor();
    await expectAccessible(page, 'the job page after a reload offline');
    await shoot(page, 'offline-2-reloaded-tablet', TABLET);
    await shoot(page, 'offline-2-reloaded-phone', PHONE);

    // The changes kept on the device, in words, from the status in the shell.
    // From the keyboard alone: the status is a link.
    await connectionStatus(page).focus();
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { level: 1, name: 'Changes kept on this device' }).waitFor();
    await page.getByText(/Waiting to be sent \(3\)/).waitFor();
    await expectAccessible(page, 'the changes kept on the device');
    await shoot(page, 'offline-3-kept-tablet', TABLET);
    await shoot(page, 'offline-3-kept-phone', PHONE);
    await page.goBack();
    await stepOpens(page, 'Verification');

    // The connection returns: the session is refreshed and the queue sent, in order, by itself.
    await page.context().setOffline(false);
    await expect.poll(() => statusOf(page), { timeout: 30_000 }).toBe('Online');
    await page
      .getByRole('status')
      .filter({ hasText: /Saved: .*sent from this device/ })
      .waitFor();

    const { job: stored } = await storedJob(server.url, jobId);
    expect(stored.runs.map((run) => run.kind)).toEqual(['initial']);
    expect(stored.runs[0]!.readings.map((reading) => reading.repeats.length)).toEqual([2, 2]);
    expect(stored.corrections.map((c) => [c.method, c.basis])).toEqual([['one-run', 'sensitivity']]);
    const [correction] = stored.corrections;
    expect(correction!.installed).not.toBeNull();
    // The plan filled in, as the form rounds it (0.1 g).
    for (const [index, weight] of correction!.installed!.entries()) {
      expect(weight.massGrams).toBeCloseTo(correction!.plan[index]!.massGrams, 1);
    }
    expect(stored.nextStep).toBe('verification');
    // The server's correction agrees with the device's: no disagreement is shown.
    expect(await statusOf(page)).not.toMatch(/to check/);
  });
});
