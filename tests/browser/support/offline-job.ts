/*
 * What the offline browser tests share: signing in, the first steps of a job typed online, a run of the
 * modelled rotor, the service worker ready with the app's files, and the job as the server stores it read
 * through the API. The readings come from a modelled rotor (the demo jobs' model), invented for our tests.
 */
import type { Page } from 'playwright-core';
import { expect } from 'vitest';
import { DEMO_PASSWORD } from '../../../server/src/auth/accounts.seed';
import { type ModelRotor, modelReadings } from '../../../server/src/jobs/model-rotor';

export const TECHNICIAN = 'technician@ridgeline-rotor.test';
export const MANAGER = 'manager@ridgeline-rotor.test';
export const TABLET = { width: 820, height: 1180 };
export const PHONE = { width: 390, height: 844 };
const SPEED_RPM = 2150;

/**
 * Invented for these tests: a mulcher whose left side responds a little more than its family's stored figure,
 * so that the one-run correction from the stored sensitivity is a real, non-zero plan.
 */
export const ROTOR: ModelRotor = {
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

export async function signIn(on: Page, base: string, email: string): Promise<void> {
  await on.goto(`${base}/sign-in`);
  await on.getByLabel('E-mail address').fill(email);
  await on.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await on.getByRole('button', { name: 'Sign in', exact: true }).click();
  await on.getByRole('button', { name: /^Your account: / }).waitFor();
}

/**
 * Waits until the service worker controls the page and has every file of its prefetched group in its cache,
 * so that a reload with no connection comes back.
 */
export async function serviceWorkerReady(on: Page): Promise<void> {
  await on.evaluate(async () => {
    await navigator.serviceWorker.ready;
    if (!navigator.serviceWorker.controller) {
      await new Promise<void>((resolve) =>
        navigator.serviceWorker.addEventListener('controllerchange', () => resolve(), { once: true }),
      );
    }
  });
  await expect
    .poll(
      () =>
        on.evaluate(async () => {
          const manifest = (await (await fetch('/ngsw.json?ngsw-cache-bust=1')).json()) as {
            assetGroups: { name: string; urls: string[] }[];
          };
          const wanted = manifest.assetGroups.find((group) => group.name === 'app')?.urls ?? [];
          const names = (await caches.keys()).filter((name) => name.endsWith(':assets:app:cache'));
          const cached = new Set<string>();
          for (const name of names) {
            for (const request of await (await caches.open(name)).keys()) {
              cached.add(new URL(request.url).pathname);
            }
          }
          return wanted.filter((url) => !cached.has(url)).length;
        }),
      { timeout: 60_000, interval: 500 },
    )
    .toBe(0);
}

/** The step shown now, by its heading. */
export async function stepOpens(on: Page, heading: string | RegExp): Promise<void> {
  await on.getByRole('heading', { level: 2, name: heading }).first().waitFor();
}

/** Starts a job on a demo machine from its page; lands on the job at its first step; answers its id. */
export async function startJobOn(on: Page, base: string, serialNumber: string): Promise<number> {
  await on.goto(`${base}/machines?q=${serialNumber}`);
  await on.getByRole('table', { name: 'Machines' }).getByRole('link', { name: serialNumber }).click();
  await on.getByRole('heading', { level: 1, name: new RegExp(serialNumber) }).waitFor();
  await on.getByRole('button', { name: 'Start a job' }).click();
  await on.waitForURL(/\/jobs\/\d+$/);
  await stepOpens(on, /safety/i);
  return Number(/\/jobs\/(\d+)/.exec(on.url())?.[1]);
}

/** Safety, inspection (within the family's limits) and set-up, stored online. */
export async function firstSteps(on: Page): Promise<void> {
  const boxes = on.getByRole('checkbox');
  await boxes.first().waitFor();
  for (const box of await boxes.all()) await box.check();
  await on.getByRole('button', { name: 'Acknowledge the cautions' }).click();
  await stepOpens(on, 'Inspection before balancing');
  await on.getByLabel('Bearing end play').fill('0.1');
  await on.getByLabel('Shaft runout').fill('0.05');
  for (const check of ['Teeth or knives', 'Build-up cleaned', 'Welds', 'Belts and pulleys']) {
    await on.getByRole('radiogroup', { name: check }).getByRole('radio', { name: 'OK' }).click();
  }
  await on.getByRole('button', { name: 'Store the inspection' }).click();
  await stepOpens(on, /set-up/i);
  await on.getByRole('button', { name: 'Store the set-up' }).click();
  await stepOpens(on, 'Runs');
}

/** Types the initial run of both sensors as the modelled rotor reads it (two repeats each). */
export async function typeInitialRun(on: Page, rotor: ModelRotor = ROTOR): Promise<void> {
  const readings = modelReadings(rotor, []);
  for (const [index, side] of (['Left', 'Right'] as const).entries()) {
    const reading = readings[index]!;
    for (let repeat = 1; repeat <= 2; repeat++) {
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
}

/** An access token of a demo person, straight from the API. */
export async function tokenOf(base: string, email: string): Promise<string> {
  const answer = await fetch(`${base}/api/v1/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  expect(answer.status).toBe(200);
  return ((await answer.json()) as { accessToken: string }).accessToken;
}

/** A job as the server stores it (the fields these tests read). */
export interface StoredJob {
  version: number;
  nextStep: string;
  machine: { id: number; familyId: number | null };
  setup: Record<string, unknown> | null;
  runs: { kind: string; by: { name: string }; readings: { sensorSide: string; repeats: unknown[] }[] }[];
  corrections: {
    sequence: number;
    method: string;
    basis: string;
    plan: { planeIndex: number; massGrams: number; angleDeg: number }[];
    installed: { planeIndex: number; massGrams: number; angleDeg: number }[] | null;
  }[];
}

/** The job as the server stores it, with its ETag, read with the person's token. */
export async function storedJob(
  base: string,
  jobId: number,
  email = TECHNICIAN,
): Promise<{ job: StoredJob; etag: string }> {
  const answer = await fetch(`${base}/api/v1/jobs/${jobId}`, {
    headers: { authorization: `Bearer ${await tokenOf(base, email)}` },
  });
  expect(answer.status).toBe(200);
  return { job: (await answer.json()) as StoredJob, etag: answer.headers.get('etag') ?? '' };
}
