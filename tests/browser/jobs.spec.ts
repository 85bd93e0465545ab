/*
 * The balancing job in the browser, against the real server over a fresh database with the demo data, as a
 * technician beside the machine types it: a whole two-plane job from the safety check to completion on a
 * tablet, with a reload half-way through a run and a save sent while the connection is down; a one-run job on
 * a family with a stored sensitivity, within the acceptance level after one trim; and an inspection that
 * fails and waits for a manager, at phone width. The readings typed come from a modelled rotor (the demo
 * jobs' model: an initial unbalance response and influence coefficients), so that every correction the
 * server works out can be fitted and verified as on a real rotor.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/src/auth/accounts.seed';
import { type ModelRotor, modelReadings } from '../../server/src/jobs/model-rotor';
import { type Browser, launchChromium } from './support/chromium';
import { startServer, type TestServer, requireBuiltWorkbench } from './support/server';
import { animationsSettled } from './support/animations';
import { expectAccessible } from './support/axe';

const SCREENS_DIR = join(process.cwd(), 'test-results', 'screens');
const TABLET = { width: 820, height: 1180 };
const PHONE = { width: 390, height: 844 };
const TECHNICIAN = 'technician@ridgeline-rotor.test';
const MANAGER = 'manager@ridgeline-rotor.test';
const SPEED_RPM = 2150;
/** Long enough for a step's answer on a loaded machine; short enough that a missing control fails soon. */
const STEP_TIMEOUT_MS = 15_000;

/** A weight on the modelled rotor: plane, grams at the plane's correction radius, angle against rotation. */
interface ModelWeight {
  readonly planeIndex: number;
  readonly massGrams: number;
  readonly angleDeg: number;
}

/**
 * Invented for this test: a mulcher drum a little stiffer than its family's average, with most of its
 * unbalance on the left (the demo mulchers' model: about 0.0016 in/s per gram on its own side).
 */
const TWO_PLANE_ROTOR: ModelRotor = {
  initial: [
    { amplitude: 0.49, phaseDeg: 118 },
    { amplitude: 0.33, phaseDeg: 251 },
  ],
  coefficients: [
    [
      { amplitudePerMass: 0.00165, phaseDeg: 44 },
      { amplitudePerMass: 0.0004, phaseDeg: 75 },
    ],
    [
      { amplitudePerMass: 0.00045, phaseDeg: 120 },
      { amplitudePerMass: 0.00148, phaseDeg: 33 },
    ],
  ],
};

/**
 * Invented for this test: a mulcher whose left side responds 20 % more than the family's stored figure and
 * 12 degrees later, so that the one-run correction leaves the left side just over the shop's 0.12 in/s and one
 * trim brings it under.
 */
const ONE_RUN_ROTOR: ModelRotor = {
  initial: [
    { amplitude: 0.46, phaseDeg: 200 },
    { amplitude: 0.07, phaseDeg: 250 },
  ],
  coefficients: [
    [
      { amplitudePerMass: 0.0019, phaseDeg: 52 },
      { amplitudePerMass: 0.0004, phaseDeg: 75 },
    ],
    [
      { amplitudePerMass: 0.00045, phaseDeg: 120 },
      { amplitudePerMass: 0.0015, phaseDeg: 35 },
    ],
  ],
};

let server: TestServer;
let technicianBrowser: Browser;
let page: Page;
const durations: Record<string, number> = {};

beforeAll(async () => {
  requireBuiltWorkbench();
  mkdirSync(SCREENS_DIR, { recursive: true });
  server = await startServer();
  technicianBrowser = await launchChromium();
  page = technicianBrowser.context.pages()[0] ?? (await technicianBrowser.context.newPage());
  page.setDefaultTimeout(STEP_TIMEOUT_MS);
  await page.setViewportSize(TABLET);
  await signIn(page, TECHNICIAN);
});

afterAll(async () => {
  console.info(`Browser job tests, seconds each: ${JSON.stringify(durations)}`);
  await technicianBrowser?.close();
  await server?.stop();
});

afterEach(async (context) => {
  // What the technician's screen showed when a test failed, for whoever reads the failure.
  if (context.task.result?.state === 'fail') {
    const name = context.task.name.replace(/\W+/g, '-').slice(0, 60);
    await page
      .screenshot({ path: join(SCREENS_DIR, `job-failed-${name}.png`), fullPage: true })
      .catch((error: unknown) => console.warn('No screenshot of the failure:', error));
  }
  // A test that failed while offline leaves the next one a connection.
  await page.context().setOffline(false);
});

async function signIn(on: Page, email: string): Promise<void> {
  await on.goto(`${server.url}/sign-in`);
  await on.getByLabel('E-mail address').fill(email);
  await on.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await on.getByRole('button', { name: 'Sign in', exact: true }).click();
  await on.getByRole('button', { name: /^Your account: / }).waitFor();
}

/** The job as the server stores it, read with the technician's own access token. */
async function storedJob(jobId: number): Promise<StoredJob> {
  const signedIn = await fetch(`${server.url}/api/v1/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: TECHNICIAN, password: DEMO_PASSWORD }),
  });
  const { accessToken } = (await signedIn.json()) as { accessToken: string };
  const answer = await fetch(`${server.url}/api/v1/jobs/${jobId}`, {
    headers: { authorization: `Bearer ${accessToken}` },
  });
  expect(answer.status).toBe(200);
  return (await answer.json()) as StoredJob;
}

interface StoredJob {
  status: string;
  nextStep: string;
  runs: { kind: string; readings: { sensorSide: string; repeats: unknown[] }[] }[];
  corrections: {
    method: string;
    basis: string;
    plan: ModelWeight[];
    installed: (ModelWeight & { radiusMm: number; fixing: string })[] | null;
  }[];
  verification: { accepted: boolean; nextSide: string | null } | null;
  inspection: { passed: boolean; override: { reason: string } | null } | null;
  completion: {
    accepted: boolean;
    familySensitivities: { sensorSide: string; planeIndex: number; jobCount?: number }[] | null;
  } | null;
}

function jobIdOf(on: Page): number {
  const match = /\/jobs\/(\d+)/.exec(on.url());
  if (!match) throw new Error(`Not on a job's page: ${on.url()}`);
  return Number(match[1]);
}

/** Takes the screenshot of the whole job page (the shell scrolls its content, so the window grows to it). */
async function shoot(on: Page, name: string): Promise<void> {
  // The stepper slides to the step a stored change moved it to: the picture waits for the slide to end.
  await animationsSettled(on);
  const viewport = on.viewportSize() ?? TABLET;
  const height = await on.evaluate(() => {
    const main = document.querySelector('main');
    return main ? main.scrollHeight + 64 : document.body.scrollHeight;
  });
  await on.setViewportSize({
    width: viewport.width,
    height: Math.max(viewport.height, Math.min(height, 8000)),
  });
  await on.screenshot({ path: join(SCREENS_DIR, `${name}.png`) });
  await on.setViewportSize(viewport);
  await expectAccessible(on, `the job page: ${name}`);
}

/** The step shown now, by its heading. */
async function stepOpens(on: Page, heading: string | RegExp): Promise<void> {
  await on.getByRole('heading', { level: 2, name: heading }).first().waitFor();
}

/** Starts a job on a demo machine from its page; lands on the job at its first step. */
async function startJobOn(on: Page, serialNumber: string): Promise<number> {
  await on.goto(`${server.url}/machines?q=${serialNumber}`);
  await on.getByRole('table', { name: 'Machines' }).getByRole('link', { name: serialNumber }).click();
  await on.getByRole('heading', { level: 1, name: new RegExp(serialNumber) }).waitFor();
  await on.getByRole('button', { name: 'Start a job' }).click();
  await on.waitForURL(/\/jobs\/\d+$/);
  await stepOpens(on, /safety/i);
  return jobIdOf(on);
}

async function acknowledgeSafety(on: Page): Promise<void> {
  const boxes = on.getByRole('checkbox');
  await boxes.first().waitFor();
  for (const box of await boxes.all()) await box.check();
  await on.getByRole('button', { name: 'Acknowledge the cautions' }).click();
  await stepOpens(on, 'Inspection before balancing');
}

/** Types the inspection's measures and marks every visual check OK. */
async function inspect(on: Page, endPlayMm: string, runoutMm: string): Promise<void> {
  await on.getByLabel('Bearing end play').fill(endPlayMm);
  await on.getByLabel('Shaft runout').fill(runoutMm);
  for (const check of ['Teeth or knives', 'Build-up cleaned', 'Welds', 'Belts and pulleys']) {
    await on.getByRole('radiogroup', { name: check }).getByRole('radio', { name: 'OK' }).click();
  }
  await on.getByRole('button', { name: 'Store the inspection' }).click();
}

/** Types one sensor's repeats of a run; the second repeat wobbles a little, as a real meter's do. */
async function typeReadings(
  on: Page,
  side: 'Left' | 'Right',
  reading: { amplitude: number; phaseDeg: number },
  repeats = 2,
): Promise<void> {
  for (let repeat = 1; repeat <= repeats; repeat++) {
    const amplitude = on.getByLabel(`Amplitude, ${side} sensor, repeat ${repeat}`, { exact: true });
    if ((await amplitude.count()) === 0) {
      await on.getByRole('button', { name: `Add a repeat to the ${side.toLowerCase()} sensor` }).click();
    }
    const wobble = repeat === 1 ? 0 : 0.004;
    await amplitude.fill((reading.amplitude + wobble).toFixed(3));
    await on
      .getByLabel(`Phase, ${side} sensor, repeat ${repeat}`, { exact: true })
      .fill(String(Math.round(reading.phaseDeg) + (repeat === 1 ? 0 : 1)));
    await on.getByLabel(`Speed, ${side} sensor, repeat ${repeat}`, { exact: true }).fill(String(SPEED_RPM));
  }
}

/** Types a run of both sensors as the modelled rotor reads it with these weights on. */
async function typeRun(on: Page, rotor: ModelRotor, weights: readonly ModelWeight[]): Promise<void> {
  const [left, right] = modelReadings(rotor, weights);
  await typeReadings(on, 'Left', left!);
  await typeReadings(on, 'Right', right!);
}

/** Types a trial run: its weight in a plane, and both sensors' readings with it on. */
async function typeTrialRun(on: Page, rotor: ModelRotor, trial: ModelWeight): Promise<void> {
  const plane = trial.planeIndex === 0 ? 'Left plane' : 'Right plane';
  await on.getByRole('combobox', { name: 'Plane' }).click();
  await on.getByRole('option', { name: plane }).click();
  await on.getByLabel('Mass', { exact: true }).fill(String(trial.massGrams));
  await on.getByLabel('Angle', { exact: true }).fill(String(trial.angleDeg));
  await typeRun(on, rotor, [trial]);
}

/** Waits for the save line to say the change is stored. */
async function saved(on: Page, what: RegExp): Promise<void> {
  await on
    .getByRole('status')
    .filter({ hasText: new RegExp(`Saved: .*${what.source}`, 'i') })
    .waitFor();
}

/** The weights the job has fitted so far, as stored, in the model's terms. */
function fittedWeights(job: StoredJob): ModelWeight[] {
  return job.corrections.flatMap((correction) =>
    (correction.installed ?? []).map(({ planeIndex, massGrams, angleDeg }) => ({
      planeIndex,
      massGrams,
      angleDeg,
    })),
  );
}

/** Picks a method in the correction step, works it out, and records what was fitted as the screen fills it. */
async function correctAndFit(on: Page, method: string, fill: 'plan' | 'split'): Promise<void> {
  await on.getByRole('radio', { name: new RegExp(method) }).check();
  await on.getByRole('button', { name: 'Work it out' }).click();
  await on.getByRole('table', { name: 'The weights to add now, per plane' }).waitFor();
  if (fill === 'plan') await on.getByRole('button', { name: 'Fill in the plan' }).click();
  await on.getByRole('button', { name: 'Record what was fitted' }).click();
  await stepOpens(on, 'Verification');
}

/** Types the verification run the modelled rotor gives with the job's fitted weights, and saves it. */
async function verify(on: Page, jobId: number, rotor: ModelRotor): Promise<StoredJob> {
  await stepOpens(on, 'Verification');
  await typeRun(on, rotor, fittedWeights(await storedJob(jobId)));
  await on.getByRole('button', { name: 'Save the verification run' }).click();
  await saved(on, /verification run/i);
  return storedJob(jobId);
}

async function completeJob(on: Page): Promise<void> {
  await stepOpens(on, 'Completion');
  await on.getByRole('button', { name: 'Complete the job' }).click();
  await on.getByRole('heading', { level: 3, name: 'Before and after' }).waitFor();
}

describe('a balancing job in the workbench', { timeout: 120_000 }, () => {
  it('takes a technician through a two-plane job from safety to completion on a tablet', async () => {
    const started = Date.now();
    const jobId = await startJobOn(page, 'QS180-0612');
    await shoot(page, 'job-1-safety-tablet');
    await acknowledgeSafety(page);
    await inspect(page, '0.12', '0.06');
    await stepOpens(page, /set-up/i);
    await shoot(page, 'job-3-setup-tablet');
    await page.getByRole('button', { name: 'Store the set-up' }).click();
    await stepOpens(page, 'Runs');

    // Half the initial run typed, then the page reloaded: the typing is still there.
    const [left] = modelReadings(TWO_PLANE_ROTOR, []);
    await typeReadings(page, 'Left', left!);
    await page.reload();
    await stepOpens(page, 'Runs');
    await expect
      .poll(() => page.getByLabel('Amplitude, Left sensor, repeat 2', { exact: true }).inputValue())
      .toBe((left!.amplitude + 0.004).toFixed(3));
    await typeRun(page, TWO_PLANE_ROTOR, []);
    await shoot(page, 'job-4-initial-run-tablet');
    await page.getByRole('button', { name: 'Save the initial run' }).click();

    // Two planes: a trial run in each, typed in the correction step where the method asks for them.
    await stepOpens(page, 'Correction');
    await page.getByRole('radio', { name: /Two planes/ }).check();
    await typeTrialRun(page, TWO_PLANE_ROTOR, { planeIndex: 0, massGrams: 100, angleDeg: 0 });
    await page.getByRole('button', { name: 'Save the trial run' }).click();
    await saved(page, /trial run/i);

    // The second trial run is saved while the connection is down: it waits on the device, which says so, and
    // is sent by itself when the connection returns (tests/browser/offline.spec.ts covers working offline).
    await page.getByRole('heading', { name: /Trial run in the right plane/i }).waitFor();
    await typeTrialRun(page, TWO_PLANE_ROTOR, { planeIndex: 1, massGrams: 100, angleDeg: 0 });
    await page.context().setOffline(true);
    await page.getByRole('button', { name: 'Save the trial run' }).click();
    await page.getByText(/Saved on this device, waiting to be sent/).waitFor();
    await shoot(page, 'job-5-saving-offline-tablet');
    await page.context().setOffline(false);
    await saved(page, /trial run/i);
    expect((await storedJob(jobId)).runs.map((run) => run.kind)).toEqual(['initial', 'trial', 'trial']);

    await page.getByRole('radio', { name: /Two planes/ }).check();
    await page.getByRole('button', { name: 'Work it out' }).click();
    await page.getByRole('table', { name: 'The weights to add now, per plane' }).waitFor();
    await shoot(page, 'job-6-correction-tablet');
    await page.getByRole('button', { name: 'Record what was fitted' }).click();

    const verified = await verify(page, jobId, TWO_PLANE_ROTOR);
    expect(verified.verification?.accepted).toBe(true);
    await shoot(page, 'job-7-verification-tablet');
    await completeJob(page);
    await shoot(page, 'job-8-completion-tablet');

    const done = await storedJob(jobId);
    expect(done.status).toBe('completed');
    expect(done.corrections.map((correction) => [correction.method, correction.basis])).toEqual([
      ['multi-plane', 'trial'],
    ]);
    expect(done.completion?.accepted).toBe(true);
    // Each of the family's figures (both sensors, both planes) now stands on the four demo mulcher jobs and this one.
    expect(done.completion?.familySensitivities?.map((figure) => figure.jobCount)).toEqual([5, 5, 5, 5]);
    durations['two-plane job, tablet'] = (Date.now() - started) / 1000;
  });

  it('balances a drum in one run from its family’s stored sensitivity, within the level after one trim', async () => {
    const started = Date.now();
    const jobId = await startJobOn(page, 'QS180-0457');
    await acknowledgeSafety(page);
    await inspect(page, '0.1', '0.05');
    await stepOpens(page, /set-up/i);
    await page.getByRole('button', { name: 'Store the set-up' }).click();
    await stepOpens(page, 'Runs');
    await typeRun(page, ONE_RUN_ROTOR, []);
    await page.getByRole('button', { name: 'Save the initial run' }).click();

    await stepOpens(page, 'Correction');
    await correctAndFit(page, 'Stored sensitivity, one run', 'plan');
    const first = await verify(page, jobId, ONE_RUN_ROTOR);
    expect(first.verification).toMatchObject({ accepted: false, nextSide: 'left' });
    await shoot(page, 'job-one-run-verification-tablet');

    await stepOpens(page, 'Correction');
    await correctAndFit(page, 'Trial weight, one plane', 'plan');
    const second = await verify(page, jobId, ONE_RUN_ROTOR);
    expect(second.verification?.accepted).toBe(true);
    await completeJob(page);

    const done = await storedJob(jobId);
    expect(done.corrections.map((correction) => [correction.method, correction.basis])).toEqual([
      ['one-run', 'sensitivity'],
      ['single-plane', 'trim'],
    ]);
    expect(done.runs.map((run) => run.kind)).toEqual(['initial', 'verification', 'verification']);
    expect(done.completion?.accepted).toBe(true);
    durations['one-run job with one trim, tablet'] = (Date.now() - started) / 1000;
  });

  it.each([
    { width: 'tablet', viewport: TABLET, serialNumber: 'BF220-18734' },
    { width: 'phone', viewport: PHONE, serialNumber: 'BF220-19102' },
  ])(
    'holds a job whose inspection fails until a manager lets it go on, at $width width',
    async ({ width, viewport, serialNumber }) => {
      const started = Date.now();
      await page.setViewportSize(viewport);
      const jobId = await startJobOn(page, serialNumber);
      await acknowledgeSafety(page);
      // The family allows 0.3 mm of end play: 0.45 mm stops the job.
      await inspect(page, '0.45', '0.05');
      await page.getByRole('heading', { name: 'The job is on hold' }).waitFor();
      await page.getByText(/a manager must decide/i).waitFor();
      await shoot(page, `job-2-inspection-on-hold-${width}`);
      expect((await storedJob(jobId)).status).toBe('on-hold');

      const managerBrowser = await launchChromium();
      try {
        const manager = managerBrowser.context.pages()[0] ?? (await managerBrowser.context.newPage());
        manager.setDefaultTimeout(STEP_TIMEOUT_MS);
        await manager.setViewportSize(viewport);
        await signIn(manager, MANAGER);
        // The job waits on the manager's home.
        await manager.goto(`${server.url}/`);
        await manager
          .getByRole('link', { name: new RegExp(serialNumber) })
          .first()
          .click();
        await manager.waitForURL(new RegExp(`/jobs/${jobId}$`));
        await animationsSettled(manager);
        await expectAccessible(manager, `the job on hold as the manager sees it, ${width}`);
        await manager.getByRole('button', { name: 'Let the job go on' }).click();
        await manager
          .getByLabel('Why the job may go on')
          .fill('End play measured on the worn gauge; bearing replaced next service, customer informed.');
        await animationsSettled(manager);
        await expectAccessible(manager, `the manager's reason to let the job go on, ${width}`);
        await manager.getByRole('button', { name: 'Let the job go on' }).last().click();
        // The job is open again, so its stepper moves on to the set-up.
        await stepOpens(manager, /set-up/i);
      } finally {
        await managerBrowser.close();
      }

      await page.reload();
      await stepOpens(page, /set-up/i);
      const job = await storedJob(jobId);
      expect(job.status).toBe('open');
      expect(job.inspection?.override?.reason).toMatch(/^End play measured on the worn gauge/);
      await shoot(page, `job-setup-after-override-${width}`);
      await page.setViewportSize(TABLET);
      durations[`failed inspection and a manager, ${width}`] = (Date.now() - started) / 1000;
    },
  );
});
