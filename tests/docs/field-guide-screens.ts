// `node --import tsx tests/docs/field-guide-screens.ts`: the pictures of the field guide
// (docs/field-guide/images/), taken from the real workbench: the production build (`npm run build`, or
// WORKBENCH_DIR) served over the demo data, signed in as the demo technician, on the demo job left after
// its first trial run: the correction step's methods, then its plan worked out. At 820 px, a tablet on a
// tailgate. Run it again after a change to the screens the guide shows, look at the pictures, and commit
// them. A script, not a test: screens are meant to change.
import { mkdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { Page } from 'playwright-core';
import { DEMO_PASSWORD } from '../../server/src/auth/accounts.seed';
import { launchChromium } from '../browser/support/chromium';
import { requireBuiltWorkbench, startServer } from '../browser/support/server';

const TECHNICIAN = 'technician@ridgeline-rotor.test';
const imagesDir = fileURLToPath(new URL('../../docs/field-guide/images/', import.meta.url));

requireBuiltWorkbench();
mkdirSync(imagesDir, { recursive: true });
const server = await startServer();
const browser = await launchChromium({ serviceWorkers: 'block' });

/** The id of the technician's open job, as the API lists it. */
async function openJobId(): Promise<number> {
  const signedIn = await fetch(`${server.url}/api/v1/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: TECHNICIAN, password: DEMO_PASSWORD }),
  });
  const { accessToken } = (await signedIn.json()) as { accessToken: string };
  const jobs = await fetch(`${server.url}/api/v1/jobs?status=open`, {
    headers: { authorization: `Bearer ${accessToken}` },
  });
  const { items } = (await jobs.json()) as { items: { id: number }[] };
  if (items[0] === undefined) throw new Error('The demo data has no open job.');
  return items[0].id;
}

async function signIn(page: Page): Promise<void> {
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel('E-mail address').fill(TECHNICIAN);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.getByRole('button', { name: /^Your account: / }).waitFor();
}

try {
  const jobId = await openJobId();
  const page = await browser.context.newPage();
  await signIn(page);
  const shoot = async (name: string) => {
    for (const width of [820]) {
      await page.setViewportSize({ width, height: 1000 });
      await page.waitForTimeout(300);
      await page.screenshot({ path: `${imagesDir}${name}-${width}.png` });
      console.log(`${name}-${width}.png`);
    }
  };
  await page.goto(`${server.url}/jobs/${jobId}`);
  // The job opens at its next step: the correction, after its initial and trial runs.
  await page.getByRole('heading', { name: 'How to work it out' }).waitFor();
  await page.waitForLoadState('networkidle');
  await shoot('correction-methods');
  await page.getByRole('radio', { name: /Trial weight, one plane/ }).check();
  await page.getByRole('button', { name: 'Work it out' }).click();
  await page.getByRole('table', { name: 'The weights to add now, per plane' }).waitFor();
  await page.getByRole('heading', { name: 'Where it can go' }).scrollIntoViewIfNeeded();
  await shoot('correction-plan');
  await page.close();
} finally {
  await browser.close();
  await server.stop();
}
