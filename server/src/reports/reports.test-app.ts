import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import sharp from 'sharp';
import request from 'supertest';
import { expect } from 'vitest';
import { as, type RecordsTestApp } from '../records/records.test-app';
import {
  type JobBody,
  jobsAs,
  machineOfFamily,
  modelReadings,
  type ModelRotor,
  runReadings,
  setupBody,
} from '../jobs/jobs.test-app';

/*
 * What the reports' specs share: a job completed through the real routes (an inspection on hold and a
 * manager's override, a trial run, a correction, the weight fitted, a verification run), signatures
 * drawn as PNGs, and the text of a PDF's pages as pdfjs reads it.
 */

/** One plane, one sensor: initial 0.5 in/s at 60°, 0.004 in/s per gram at 30°. */
export const SINGLE: ModelRotor = {
  initial: [{ amplitude: 0.5, phaseDeg: 60 }],
  coefficients: [[{ amplitudePerMass: 0.004, phaseDeg: 30 }]],
};

/** The reason the manager gives to let the job go on. */
export const OVERRIDE_REASON =
  'End play checked with the customer: bearings ordered, balance now to finish the season.';

/** A completed job and what the specs look for in its report. */
export interface CompletedJob {
  readonly job: JobBody;
  readonly machineId: number;
  readonly customerId: number;
  readonly serialNumber: string;
  readonly weight: { massGrams: number; angleDeg: number };
}

/** A one-plane job on a new machine of `token`'s organisation, completed by the technician. */
export async function completedJob(test: RecordsTestApp, technicianToken: string): Promise<CompletedJob> {
  const { machineId } = await machineOfFamily(test, test.tokens.owner, { planeCount: 1 });
  const machine = (await as(test.app, test.tokens.owner).get(`/api/v1/machines/${machineId}`)).body as {
    customerId: number;
    serialNumber: string;
  };
  const technician = jobsAs(test, technicianToken);
  const manager = jobsAs(test, test.tokens.manager);
  const created = await technician.create({ machineId, scheduledFor: '2026-05-04' });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  const path = `/api/v1/jobs/${created.body.id}`;
  const step = async (
    who: ReturnType<typeof jobsAs>,
    method: 'post' | 'put',
    suffix: string,
    body: object | undefined,
    version: number,
    status = 200,
  ): Promise<JobBody> => {
    const answer = await (method === 'post'
      ? who.post(`${path}${suffix}`, body, version)
      : who.put(`${path}${suffix}`, body!, version));
    expect(answer.status, `${suffix}: ${JSON.stringify(answer.body)}`).toBe(status);
    return answer.body as JobBody;
  };
  let job = await step(
    technician,
    'put',
    '/safety',
    { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] },
    1,
  );
  job = await step(
    technician,
    'put',
    '/inspection',
    {
      bearingEndPlayMm: 0.42,
      shaftRunoutMm: 0.05,
      checks: { teethOrKnives: 'fixed', buildUpCleaned: 'fixed', welds: 'ok', beltsAndPulleys: 'ok' },
      notes: 'Two teeth replaced before the runs.',
    },
    job.version,
  );
  expect(job.status).toBe('on-hold');
  job = await step(manager, 'post', '/inspection/override', { reason: OVERRIDE_REASON }, job.version);
  job = await step(technician, 'put', '/setup', setupBody(['left']), job.version);
  job = await step(
    technician,
    'post',
    '/runs',
    { kind: 'initial', readings: runReadings(['left'], SINGLE.initial) },
    job.version,
    201,
  );
  const trialWeight = { planeIndex: 0, massGrams: 50, angleDeg: 0 };
  job = await step(
    technician,
    'post',
    '/runs',
    { kind: 'trial', trialWeight, readings: runReadings(['left'], modelReadings(SINGLE, [trialWeight])) },
    job.version,
    201,
  );
  job = await step(technician, 'post', '/corrections', { method: 'single-plane' }, job.version, 201);
  const correction = job.corrections.at(-1)!;
  const plan = correction.plan[0]!;
  const weight = { massGrams: Math.round(plan.massGrams), angleDeg: Math.round(plan.angleDeg) % 360 };
  job = await step(
    technician,
    'put',
    `/corrections/${correction.id}/installed`,
    { weights: [{ planeIndex: 0, ...weight, radiusMm: 210, fixing: 'welded' }] },
    job.version,
  );
  job = await step(
    technician,
    'post',
    '/runs',
    {
      kind: 'verification',
      readings: runReadings(['left'], modelReadings(SINGLE, [{ planeIndex: 0, ...weight }])),
    },
    job.version,
    201,
  );
  job = await step(technician, 'post', '/complete', undefined, job.version);
  expect(job.status).toBe('completed');
  return { job, machineId, customerId: machine.customerId, serialNumber: machine.serialNumber, weight };
}

/** A PNG data URL of `width` × `height`: a stroke drawn across a transparent pad, or nothing at all. */
export async function signatureDataUrl(
  options: { width?: number; height?: number; drawn?: boolean } = {},
): Promise<string> {
  const width = options.width ?? 600;
  const height = options.height ?? 200;
  const pixels = Buffer.alloc(width * height * 4);
  if (options.drawn ?? true) {
    for (let x = Math.floor(width * 0.1); x < Math.floor(width * 0.9); x++) {
      const y = Math.floor(height / 2 + Math.sin(x / 15) * height * 0.25);
      for (let dy = -2; dy <= 2; dy++) {
        const offset = ((y + dy) * width + x) * 4;
        pixels[offset + 3] = 255;
      }
    }
  }
  const png = await sharp(pixels, { raw: { width, height, channels: 4 } })
    .png()
    .toBuffer();
  return `data:image/png;base64,${png.toString('base64')}`;
}

/** The text of each page of a PDF, its items joined by spaces. */
export async function pdfPages(bytes: Buffer): Promise<string[]> {
  const document = await getDocument({
    data: new Uint8Array(bytes),
    disableFontFace: true,
    useSystemFonts: false,
  }).promise;
  const pages: string[] = [];
  for (let number = 1; number <= document.numPages; number++) {
    const page = await document.getPage(number);
    const content = await page.getTextContent();
    pages.push(
      content.items
        .map((item) => ('str' in item ? item.str : ''))
        .join(' ')
        .replace(/\s+/g, ' '),
    );
  }
  await document.destroy();
  return pages;
}

/** GETs a binary answer (a PDF, an attachment) with `token`; `body` is its bytes. */
export function download(test: RecordsTestApp, token: string, path: string) {
  return request(test.app)
    .get(path)
    .set('Authorization', `Bearer ${token}`)
    .buffer(true)
    .parse((res, callback) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => callback(null, Buffer.concat(chunks)));
    });
}
