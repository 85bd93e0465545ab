/*
 * A job's records in the browser, against the real server over a fresh database with the demo data, as a
 * technician on a tablet: a photo of the rotor taken with the location on (the stored image keeps none of
 * its metadata) and a script renamed photo.jpg refused in words; the readings of a job imported from a CSV
 * file, a bad row named first and the fixed file imported; and a machine's job history with its chart, its
 * table checked against the API, and the shop's jobs downloaded as CSV from the Jobs list.
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/src/auth/accounts.seed';
import { DEMO_JOBS } from '../../server/src/jobs/jobs.seed';
import { type ModelRotor, modelReadings } from '../../server/src/jobs/model-rotor';
import { type Browser, launchChromium } from './support/chromium';
import { startServer, type TestServer, requireBuiltWorkbench } from './support/server';
import { animationsSettled } from './support/animations';
import { expectAccessible } from './support/axe';

const SCREENS_DIR = join(process.cwd(), 'test-results', 'screens');
const TABLET = { width: 820, height: 1180 };
const TECHNICIAN = 'technician@ridgeline-rotor.test';
const STEP_TIMEOUT_MS = 15_000;
const API = '/api/v1';
/** The demo mulcher with photos (photos.seed.ts) and the demo mulchers used for the import and the history. */
const PHOTO_SERIAL = 'BF250-00921';
const IMPORT_SERIAL = 'QS180-0457';
const HISTORY_SERIAL = 'QS180-0612';
const IMPORT_SPEED_RPM = 2300;

/**
 * Invented for this test: a mulcher drum like the demo family's (about 0.0016 in/s per gram on its own side,
 * a quarter of it across), most of its unbalance on the right.
 */
const IMPORT_ROTOR: ModelRotor = {
  initial: [
    { amplitude: 0.31, phaseDeg: 142 },
    { amplitude: 0.44, phaseDeg: 296 },
  ],
  coefficients: [
    [
      { amplitudePerMass: 0.0017, phaseDeg: 46 },
      { amplitudePerMass: 0.0004, phaseDeg: 75 },
    ],
    [
      { amplitudePerMass: 0.00045, phaseDeg: 120 },
      { amplitudePerMass: 0.0015, phaseDeg: 31 },
    ],
  ],
};

let server: TestServer;
let browser: Browser;
let page: Page;
let workDir: string;
const durations: Record<string, number> = {};

beforeAll(async () => {
  requireBuiltWorkbench();
  mkdirSync(SCREENS_DIR, { recursive: true });
  workDir = mkdtempSync(join(tmpdir(), 'counterpoise-job-records-'));
  server = await startServer();
  browser = await launchChromium();
  page = browser.context.pages()[0] ?? (await browser.context.newPage());
  page.setDefaultTimeout(STEP_TIMEOUT_MS);
  // File choosers are caught from the start: a listener added only beside the key press that opens one
  // would race it (Enter clicks on key down), and a chooser opened before the listener is lost.
  page.on('filechooser', () => undefined);
  await page.setViewportSize(TABLET);
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel('E-mail address').fill(TECHNICIAN);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.getByRole('button', { name: /^Your account: / }).waitFor();
});

afterAll(async () => {
  console.info(`Browser job records tests, seconds each: ${JSON.stringify(durations)}`);
  await browser?.close();
  await server?.stop();
  if (workDir) rmSync(workDir, { recursive: true, force: true });
});

afterEach(async (context) => {
  if (context.task.result?.state === 'fail') {
    const name = context.task.name.replace(/\W+/g, '-').slice(0, 60);
    await page
      .screenshot({ path: join(SCREENS_DIR, `records-failed-${name}.png`), fullPage: true })
      .catch((error: unknown) => console.warn('No screenshot of the failure:', error));
  }
});

/** The technician's access token, from a sign-in of its own (the API as any client calls it). */
let token: string | undefined;
async function accessToken(): Promise<string> {
  if (token) return token;
  const signedIn = await fetch(`${server.url}${API}/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: TECHNICIAN, password: DEMO_PASSWORD }),
  });
  expect(signedIn.status).toBe(200);
  token = ((await signedIn.json()) as { accessToken: string }).accessToken;
  return token;
}

/** A request to the API as the technician; fails the test on anything but the status expected. */
async function api(path: string, init: RequestInit = {}, status = 200): Promise<Response> {
  const answer = await fetch(`${server.url}${API}${path}`, {
    ...init,
    headers: { authorization: `Bearer ${await accessToken()}`, ...init.headers },
  });
  if (answer.status !== status) {
    throw new Error(`${init.method ?? 'GET'} ${path}: ${answer.status} ${await answer.text()}`);
  }
  return answer;
}

async function machineIdOf(serialNumber: string): Promise<number> {
  const answer = await api(`/machines?q=${serialNumber}`);
  const { items } = (await answer.json()) as { items: { id: number; serialNumber: string | null }[] };
  const machine = items.find((item) => item.serialNumber === serialNumber);
  if (!machine) throw new Error(`No demo machine ${serialNumber}.`);
  return machine.id;
}

/** A screenshot of the whole page once the animations that end have ended (spinners turn for ever). */
async function shoot(name: string): Promise<void> {
  await animationsSettled(page);

  const height = await page.evaluate(() => {
    const main = document.querySelector('main');
    return main ? main.scrollHeight + 64 : document.body.scrollHeight;
  });
  await page.setViewportSize({
    width: TABLET.width,
    height: Math.max(TABLET.height, Math.min(height, 8000)),
  });
  await page.screenshot({ path: join(SCREENS_DIR, `records-${name}.png`) });
  await page.setViewportSize(TABLET);
  await expectAccessible(page, `a job's records: ${name}`);
}

/** The text of the element that has the keyboard's focus. */
function focusedText(): Promise<string> {
  return page.evaluate(() => document.activeElement?.textContent?.trim() ?? '');
}

/** Opens a demo machine's page from the machines list, as the technician finds it. */
async function openMachine(serialNumber: string): Promise<void> {
  await page.goto(`${server.url}/machines?q=${serialNumber}`);
  await page.getByRole('table', { name: 'Machines' }).getByRole('link', { name: serialNumber }).click();
  await page.getByRole('heading', { level: 1, name: new RegExp(serialNumber) }).waitFor();
}

/**
 * A photo as a tablet's camera leaves it: a drawing of a drum's end plate (hub, rim, teeth, the reflective
 * tape) as a JPEG, with EXIF naming the device and where it was taken (GPS).
 */
async function cameraJpeg(): Promise<Buffer> {
  const teeth = Array.from({ length: 24 }, (_, index) => {
    const angle = (index * 15 * Math.PI) / 180;
    const x = 640 + 330 * Math.cos(angle);
    const y = 480 + 330 * Math.sin(angle);
    return `<rect x="${(x - 14).toFixed(1)}" y="${(y - 14).toFixed(1)}" width="28" height="28" fill="#3d3a35" transform="rotate(${index * 15} ${x.toFixed(1)} ${y.toFixed(1)})"/>`;
  }).join('');
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="1280" height="960">
    <rect width="1280" height="960" fill="#6b705f"/>
    <circle cx="640" cy="480" r="320" fill="#9a9b8f" stroke="#2f2e2a" stroke-width="18"/>
    ${teeth}
    <circle cx="640" cy="480" r="90" fill="#4a4843"/>
    <circle cx="640" cy="480" r="36" fill="#22211e"/>
    <rect x="880" y="430" width="60" height="22" fill="#d8d24a" transform="rotate(15 640 480)"/>
  </svg>`;
  return sharp(Buffer.from(svg))
    .jpeg({ quality: 88 })
    .withExif({
      IFD0: { Make: 'Workshop tablet', Model: 'Field camera', DateTime: '2026:11:30 09:41:07' },
      IFD3: {
        GPSLatitudeRef: 'N',
        GPSLatitude: '52/1 11/1 2304/100',
        GPSLongitudeRef: 'W',
        GPSLongitude: '2/1 7/1 5120/100',
      },
    })
    .toBuffer();
}

interface PhotoList {
  photos: { id: number; caption: string | null }[];
}

/** The readings of one run, one row per repeat of each sensor, with a made-up scatter between repeats. */
function csvRowsOf(
  run: number,
  kind: 'initial' | 'trial',
  trial: { planeIndex: number; massGrams: number } | null,
): string[] {
  const readings = modelReadings(
    IMPORT_ROTOR,
    trial ? [{ planeIndex: trial.planeIndex, massGrams: trial.massGrams, angleDeg: 0 }] : [],
  );
  const trialCells = trial ? `${trial.planeIndex},${trial.massGrams},0` : ',,';
  return (['left', 'right'] as const).flatMap((side, index) =>
    [0, 1, 2].map((repeat) => {
      const wobble = [0, 1, -1][repeat]!;
      const reading = readings[index]!;
      const amplitude = (reading.amplitude * (1 + wobble / 100)).toFixed(3);
      const phase = (Math.round(reading.phaseDeg) + wobble + 360) % 360;
      const speed = IMPORT_SPEED_RPM + wobble * 2;
      return `${run},${kind},${side},${amplitude},${phase},${speed},in/s-pk,${trialCells}`;
    }),
  );
}

/** A technician's file of a job's readings: the initial run and a trial weight in each plane. */
function readingsCsv(): string[] {
  return [
    `# ${IMPORT_SERIAL}, read in the yard; vibration meter on the bearing housings, 1x filter`,
    'run,kind,sensorSide,amplitude,phaseDeg,speedRpm,amplitudeUnit,trialPlaneIndex,trialMassGrams,trialAngleDeg',
    ...csvRowsOf(1, 'initial', null),
    '',
    ...csvRowsOf(2, 'trial', { planeIndex: 0, massGrams: 80 }),
    '',
    ...csvRowsOf(3, 'trial', { planeIndex: 1, massGrams: 80 }),
  ];
}

interface StoredJob {
  id: number;
  version: number;
  nextStep: string;
  runs: {
    sequence: number;
    kind: string;
    trialWeight: { planeIndex: number; massGrams: number } | null;
    readings: { sensorSide: string; repeats: unknown[]; average: { amplitude: number } }[];
  }[];
}

/** Starts a job on a machine through the API and takes it through safety, inspection and set-up. */
async function jobReadyForRuns(serialNumber: string): Promise<StoredJob> {
  const json = { 'content-type': 'application/json' };
  const created = await api(
    '/jobs',
    {
      method: 'POST',
      headers: json,
      body: JSON.stringify({
        machineId: await machineIdOf(serialNumber),
        scheduledFor: new Date().toISOString().slice(0, 10),
      }),
    },
    201,
  );
  let job = (await created.json()) as StoredJob;
  const step = async (path: string, body: unknown) => {
    const answer = await api(`/jobs/${job.id}/${path}`, {
      method: 'PUT',
      headers: { ...json, 'if-match': `"${job.version}"` },
      body: JSON.stringify(body),
    });
    job = (await answer.json()) as StoredJob;
  };
  await step('safety', { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] });
  await step('inspection', {
    bearingEndPlayMm: 0.12,
    shaftRunoutMm: 0.05,
    checks: { teethOrKnives: 'fixed', buildUpCleaned: 'fixed', welds: 'ok', beltsAndPulleys: 'ok' },
    notes: 'Three teeth on row 4 replaced; packed soil washed out of the drum.',
  });
  await step('setup', {
    sensors: [
      { side: 'left', position: 'Left bearing housing, horizontal' },
      { side: 'right', position: 'Right bearing housing, horizontal' },
    ],
    tachometer: 'Magnetic stand on the left skid, aimed at the end plate',
    referenceMark: 'Reflective tape on the left end plate, in line with tooth row 1',
    rotationSeenFromLeft: 'clockwise',
    operatingSpeedRpm: IMPORT_SPEED_RPM,
    amplitudeUnit: 'in/s-pk',
    phaseSense: 'lag',
    weightAngles: 'againstRotation',
  });
  expect(job.nextStep).toBe('runs');
  return job;
}

describe('a job’s records in the workbench', { timeout: 60_000 }, () => {
  it('keeps a photo of the rotor without its location, and refuses a script named photo.jpg in words', async () => {
    const started = Date.now();
    const machineId = await machineIdOf(PHOTO_SERIAL);
    const before = (await (await api(`/machines/${machineId}/photos`)).json()) as PhotoList;
    const jpeg = await cameraJpeg();
    // The photo as taken carries EXIF (the device, the place).
    expect((await sharp(jpeg).metadata()).exif?.length ?? 0).toBeGreaterThan(0);
    const photoPath = join(workDir, 'left-end-plate.jpg');
    writeFileSync(photoPath, jpeg);

    await openMachine(PHOTO_SERIAL);
    const gallery = page.getByRole('region', { name: 'Photos' });
    const thumbnails = gallery.getByRole('button', { name: /^Show large: / });
    await expect.poll(() => thumbnails.count()).toBe(before.photos.length);
    const caption = 'Left end plate after cleaning, tape at tooth row 1';
    await gallery.getByLabel('Caption for the next photo (optional)').fill(caption);
    // From the keyboard: Tab to the button, Enter opens the chooser (the camera on a real tablet).
    await page.keyboard.press('Tab');
    await expect.poll(() => focusedText()).toContain('Take or add a photo');
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.keyboard.press('Enter')]);
    await chooser.setFiles(photoPath);
    const added = gallery.getByRole('button', { name: `Show large: ${caption}` });
    await added.locator('img').waitFor();
    await expect.poll(() => thumbnails.count()).toBe(before.photos.length + 1);
    await added.scrollIntoViewIfNeeded();
    await shoot('photo-added-tablet');

    // The stored image: a JPEG of the drawing, with no EXIF at all.
    const after = (await (await api(`/machines/${machineId}/photos`)).json()) as PhotoList;
    const stored = after.photos.find((photo) => photo.caption === caption);
    expect(stored).toBeDefined();
    const image = Buffer.from(await (await api(`/photos/${stored!.id}`)).arrayBuffer());
    const metadata = await sharp(image).metadata();
    expect(metadata.format).toBe('jpeg');
    expect(metadata.width).toBe(1280);
    expect(metadata.exif).toBeUndefined();
    expect(image.includes(Buffer.from('Workshop tablet'))).toBe(false);

    // A shell script named like a photo: refused in words, naming the file; nothing added.
    const scriptPath = join(workDir, 'photo.jpg');
    writeFileSync(
      scriptPath,
      '#!/bin/sh\n# copies the photos to the office share\ncp ./*.jpg /mnt/office/\n',
    );
    const [again] = await Promise.all([
      page.waitForEvent('filechooser'),
      gallery.getByRole('button', { name: 'Take or add a photo' }).press('Enter'),
    ]);
    await again.setFiles(scriptPath);
    const refusal = gallery.getByText(/The photo was not stored\./);
    await refusal.waitFor();
    expect(await refusal.textContent()).toMatch(
      /photo\.jpg: The file is not an image this server reads; send a JPEG/,
    );
    await expect.poll(() => thumbnails.count()).toBe(before.photos.length + 1);
    const last = (await (await api(`/machines/${machineId}/photos`)).json()) as PhotoList;
    expect(last.photos.map((photo) => photo.id)).toEqual(after.photos.map((photo) => photo.id));
    await refusal.scrollIntoViewIfNeeded();
    await shoot('photo-refused-tablet');
    durations['photos'] = (Date.now() - started) / 1000;
  });

  it('imports a job’s readings from a CSV file once its bad row is fixed', async () => {
    const started = Date.now();
    const job = await jobReadyForRuns(IMPORT_SERIAL);
    const lines = readingsCsv();
    // A phase typed 412 for 142 on the second repeat of the left sensor in run 2 (the first trial run).
    const badIndex = lines.findIndex((line) => line.startsWith('2,trial,left,')) + 1;
    const bad = [...lines];
    bad[badIndex] = bad[badIndex]!.replace(/^(2,trial,left,[\d.]+,)\d+,/, '$1412,');
    expect(bad[badIndex]).toContain(',412,');
    const badPath = join(workDir, 'qs180-0457-readings.csv');
    writeFileSync(badPath, `${bad.join('\r\n')}\r\n`);

    await page.goto(`${server.url}/jobs/${job.id}`);
    await page.getByRole('heading', { level: 2, name: 'Runs' }).waitFor();
    await page.getByRole('button', { name: 'Import readings from a file' }).click();
    const dialog = page.getByRole('dialog', { name: 'Import readings from a file' });
    // The dialog opens on its first control, "Choose a CSV file": Enter opens the chooser.
    await expect.poll(() => focusedText()).toContain('Choose a CSV file');
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.keyboard.press('Enter')]);
    await chooser.setFiles(badPath);
    const problem = dialog.locator('.readings-import__problems li');
    await problem.first().waitFor();
    expect(await problem.count()).toBe(1);
    expect(await problem.first().textContent()).toMatch(
      new RegExp(`^\\s*Row ${badIndex + 1}, phase: .*359\\.9.*Found “412”\\.\\s*$`),
    );
    await dialog.getByText('1 problem in the file: nothing can be imported until it is fixed.').waitFor();
    const importButton = dialog.getByRole('button', { name: /^Import/ });
    expect(await importButton.isDisabled()).toBe(true);
    await shoot('readings-bad-row-tablet');

    // The file fixed and saved under the same name, chosen again.
    writeFileSync(badPath, `${lines.join('\r\n')}\r\n`);
    const [again] = await Promise.all([
      page.waitForEvent('filechooser'),
      dialog.getByRole('button', { name: 'Choose another file' }).click(),
    ]);
    await again.setFiles(badPath);
    await dialog.getByText('3 runs to add from 18 rows. Nothing is saved until you import.').waitFor();
    expect(await problem.count()).toBe(0);
    const previewRuns = dialog.locator('tbody[data-run]');
    expect(await previewRuns.count()).toBe(3);
    expect(await previewRuns.nth(0).textContent()).toContain('Run 1');
    expect(await previewRuns.nth(1).textContent()).toMatch(/80 g/);
    await shoot('readings-preview-tablet');
    const importRuns = dialog.getByRole('button', { name: 'Import 3 runs' });
    expect(await importRuns.isEnabled()).toBe(true);
    await importRuns.click();
    await dialog.waitFor({ state: 'hidden' });

    // On the server: the three runs, three repeats a sensor, in the file's order.
    const stored = (await (await api(`/jobs/${job.id}`)).json()) as StoredJob;
    expect(stored.runs.map((run) => [run.sequence, run.kind, run.trialWeight?.planeIndex ?? null])).toEqual([
      [1, 'initial', null],
      [2, 'trial', 0],
      [3, 'trial', 1],
    ]);
    expect(stored.runs.every((run) => run.readings.every((reading) => reading.repeats.length === 3))).toBe(
      true,
    );

    // On the page: the runs step lists them, with the averages the server stored.
    const runsTab = page.getByRole('tab', { name: /Runs/ });
    await runsTab.click();
    const runs = page.getByRole('list', { name: 'Runs of the job' });
    await expect.poll(() => runs.getByRole('listitem').count()).toBe(3);
    const initialLeft = stored.runs[0]!.readings.find((reading) => reading.sensorSide === 'left')!;
    const shown = initialLeft.average.amplitude.toLocaleString('en-GB', { maximumFractionDigits: 3 });
    expect(await runs.getByRole('region', { name: 'Run 1, left sensor' }).textContent()).toContain(shown);
    await shoot('readings-imported-tablet');
    durations['readings import'] = (Date.now() - started) / 1000;
  });

  it('shows a machine’s job history against the API, and downloads the shop’s jobs as CSV', async () => {
    const started = Date.now();
    const machineId = await machineIdOf(HISTORY_SERIAL);
    const history = (await (await api(`/machines/${machineId}/job-history`)).json()) as {
      jobs: { id: number; sides: { sensorSide: string; before: { amplitude: number } | null }[] }[];
    };
    expect(history.jobs.length).toBeGreaterThan(0);

    await openMachine(HISTORY_SERIAL);
    const link = page.getByRole('link', { name: 'Job history' });
    await link.focus();
    await page.keyboard.press('Enter');
    await page.waitForURL(new RegExp(`/machines/${machineId}/history$`));
    await page
      .getByRole('heading', { level: 1, name: new RegExp(`History of .*${HISTORY_SERIAL}`) })
      .waitFor();
    const canvas = page.locator('app-history-chart canvas');
    await canvas.waitFor();
    const box = await canvas.boundingBox();
    expect(box?.width ?? 0).toBeGreaterThan(200);
    expect(box?.height ?? 0).toBeGreaterThan(100);

    // The demo job's left side before balancing, as the API gives it and the table shows it.
    const demoJob = history.jobs[0]!;
    const left = demoJob.sides.find((side) => side.sensorSide === 'left')!;
    const amplitude = Number(left.before!.amplitude.toPrecision(3)).toLocaleString('en-GB', {
      maximumFractionDigits: 4,
    });
    const rows = page.getByTestId('history-job');
    await expect.poll(() => rows.count()).toBe(history.jobs.length);
    const row = rows.filter({ has: page.getByRole('link', { name: `Job no. ${demoJob.id}` }) });
    const leftRow = row
      .getByRole('row')
      .filter({ has: page.getByRole('cell', { name: 'Left', exact: true }) });
    expect(await leftRow.locator('td[data-label="Before"] .amplitude').textContent()).toBe(
      `${amplitude} in/s peak`,
    );
    await shoot('history-tablet');

    // The Jobs list's export, for a range that holds every demo job (the oldest is 420 days old).
    await page.goto(`${server.url}/jobs`);
    const exporter = page.getByRole('region', { name: 'Download the jobs as CSV' });
    const today = new Date();
    const from = new Date(today.getTime() - 500 * 86_400_000).toISOString().slice(0, 10);
    const to = today.toISOString().slice(0, 10);
    await exporter.getByLabel('First day').fill(from);
    await exporter.getByLabel('Last day').fill(to);
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      // Enter in the last day's field sends the form, as Download CSV does.
      exporter.getByLabel('Last day').press('Enter'),
    ]);
    expect(download.suggestedFilename()).toBe(`counterpoise-jobs-${from}-to-${to}.csv`);
    const file = readFileSync((await download.path())!);
    expect([...file.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const text = file.subarray(3).toString('utf8');
    expect(text.startsWith('Job no.,')).toBe(true);
    // A row for every demo job, each naming its machine's serial number.
    for (const demo of DEMO_JOBS) expect(text).toContain(`,${demo.serialNumber},`);
    await exporter.getByText(`Saved counterpoise-jobs-${from}-to-${to}.csv.`).waitFor();
    await exporter.scrollIntoViewIfNeeded();
    await shoot('jobs-export-tablet');
    durations['history and export'] = (Date.now() - started) / 1000;
  });
});
