/*
 * A conflict between the device and the server, in the browser against the real server over a fresh
 * database with the demo data: the technician saves a run with no connection while a manager changes the same
 * job on the server (the set-up stored again, through the API). When the connection returns the device meets
 * the change (412), keeps its own, and shows both to the technician, who either sends theirs on top of the
 * manager's or discards it (after a confirmation naming what is lost, with a list kept to read). Nothing is
 * dropped silently.
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
  MANAGER,
  PHONE,
  signIn,
  startJobOn,
  storedJob,
  TABLET,
  TECHNICIAN,
  tokenOf,
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
  await signIn(page, server.url, TECHNICIAN);
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

afterEach(async (context) => {
  if (context.task.result?.state === 'fail') {
    const name = context.task.name.replace(/\W+/g, '-').slice(0, 40);
    await page
      .screenshot({ path: join(SCREENS_DIR, `offline-conflict-failed-${name}.png`), fullPage: true })
      .catch((error: unknown) => console.warn('No screenshot of the failure:', error));
  }
  await page.context().setOffline(false);
});

function connectionStatus(on: Page) {
  return on.getByRole('link', { name: /^Connection: / });
}

/** What the status says, as its label reads it out: "Online", "Offline · 3 waiting", "1 conflict"… */
async function statusOf(on: Page): Promise<string> {
  const label = (await connectionStatus(on).getAttribute('aria-label')) ?? '';
  return /^Connection: (.*)\. Changes kept on this device$/.exec(label)?.[1] ?? label;
}

async function shoot(on: Page, name: string, viewport: { width: number; height: number }): Promise<void> {
  await on.setViewportSize(viewport);
  await animationsSettled(on);
  await on.screenshot({ path: join(SCREENS_DIR, `${name}.png`) });
  await on.setViewportSize(TABLET);
}

/** A manager stores the job's set-up again through the API, as it stands: the job's version moves on. */
async function managerStoresSetupAgain(jobId: number): Promise<void> {
  const { job, etag } = await storedJob(server.url, jobId, MANAGER);
  const { recordedAt: _recordedAt, ...setup } = job.setup ?? {};
  const answer = await fetch(`${server.url}/api/v1/jobs/${jobId}/setup`, {
    method: 'PUT',
    headers: {
      authorization: `Bearer ${await tokenOf(server.url, MANAGER)}`,
      'content-type': 'application/json',
      'if-match': etag,
    },
    body: JSON.stringify(setup),
  });
  expect(answer.status).toBe(200);
}

/** Starts a job online, saves its initial run offline, and has the manager change the job meanwhile. */
async function runSavedOfflineWhileManagerChangesIt(
  serialNumber: string,
): Promise<{ jobId: number; version: number }> {
  const jobId = await startJobOn(page, server.url, serialNumber);
  await firstSteps(page);
  await page.context().setOffline(true);
  await typeInitialRun(page);
  await page.getByRole('button', { name: 'Save the initial run' }).click();
  await page.getByText(/Saved on this device, waiting to be sent/).waitFor();
  await managerStoresSetupAgain(jobId);
  const { job } = await storedJob(server.url, jobId);
  await page.context().setOffline(false);
  await page.getByRole('heading', { name: /changed on the server while this device was offline/ }).waitFor();
  await expect.poll(() => statusOf(page)).toMatch(/1 conflict/);
  await page.getByText('Readings of the initial run', { exact: false }).first().waitFor();
  return { jobId, version: job.version };
}

describe('a conflict with a change made on the server meanwhile', { timeout: 180_000 }, () => {
  it('sends the device’s run on top of the manager’s change when the technician chooses so', async () => {
    const { jobId, version } = await runSavedOfflineWhileManagerChangesIt('QS180-0457');
    // The run is not on the server yet: it waits on the device, shown beside the server's job.
    expect((await storedJob(server.url, jobId)).job.runs).toEqual([]);
    await expectAccessible(page, 'the conflict on the job page');
    await shoot(page, 'offline-conflict-tablet', TABLET);
    await shoot(page, 'offline-conflict-phone', PHONE);

    // From the keyboard alone.
    await page.getByRole('button', { name: 'Send mine on top of theirs' }).focus();
    await page.keyboard.press('Enter');
    await expect.poll(() => statusOf(page), { timeout: 30_000 }).toBe('Online');
    const { job } = await storedJob(server.url, jobId);
    expect(job.runs.map((run) => run.kind)).toEqual(['initial']);
    expect(job.version).toBe(version + 1);
    expect(job.nextStep).toBe('correction');
  });

  it('discards the device’s run, after a confirmation naming it, and keeps a list of it to read', async () => {
    const { jobId, version } = await runSavedOfflineWhileManagerChangesIt('QS180-0612');

    await page.getByRole('button', { name: 'Discard mine' }).focus();
    await page.keyboard.press('Enter');
    const dialog = page.getByRole('alertdialog');
    await dialog.getByText(/Readings of the initial run/).waitFor();
    await expectAccessible(page, 'the confirmation of discarding');
    // From the keyboard alone: Cancel holds the first focus, the named action is the next.
    await page.keyboard.press('Tab');
    const discard = dialog.getByRole('button', { name: 'Discard mine' });
    expect(await discard.evaluate((button) => button === document.activeElement)).toBe(true);
    await page.keyboard.press('Enter');

    await page.getByRole('heading', { name: /Discarded from this device/ }).waitFor();
    await page
      .getByRole('region', { name: /Discarded from this device/ })
      .getByText(/Readings of the initial run/)
      .waitFor();
    await expect.poll(() => statusOf(page)).toBe('Online');
    // Nothing claims it was sent.
    expect(await page.getByText(/sent from this device/).count()).toBe(0);
    await expectAccessible(page, 'the list of discarded changes');
    await shoot(page, 'offline-discarded-tablet', TABLET);
    // The job stays as the manager left it; the run was not sent.
    const { job } = await storedJob(server.url, jobId);
    expect(job.runs).toEqual([]);
    expect(job.version).toBe(version);

    await page.getByRole('button', { name: 'Dismiss' }).focus();
    await page.keyboard.press('Enter');
    await expect
      .poll(() => page.getByRole('heading', { name: /Discarded from this device/ }).count())
      .toBe(0);
  });
});
