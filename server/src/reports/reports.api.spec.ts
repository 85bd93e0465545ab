/*
 * The service report through the real app: the PDF's text read back with pdfjs (the job's figures in
 * it), signing and its refusals, frozen revisions, who may read or sign, e-mail with the PDF attached
 * through the local mail server and the Outbox, and parallel signings and sendings.
 */
import { createHash } from 'node:crypto';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { JobReportsSchema, OutboxSchema, ReportSendingSchema } from '@counterpoise/api';
import { as, type RecordsTestApp, rowCount, startRecordsTestApp } from '../records/records.test-app';
import { jobsAs, secondTechnician } from '../jobs/jobs.test-app';
import { formatFigure } from './report-drawings';
import {
  type CompletedJob,
  completedJob,
  download,
  OVERRIDE_REASON,
  pdfPages,
  signatureDataUrl,
} from './reports.test-app';

let test: RecordsTestApp;
let signature: string;
beforeAll(async () => {
  test = await startRecordsTestApp();
  signature = await signatureDataUrl();
});
afterAll(async () => test.close());

const jobPath = (id: number) => `/api/v1/jobs/${id}`;
/** How many rows of `table` belong to the job. */
function rowsOfJob(table: 'job_reports' | 'job_report_sendings', jobId: number): number {
  const row = test.temporary.database.sqlite
    .prepare(`SELECT count(*) AS count FROM ${table} WHERE job_id = ?`)
    .get(jobId);
  return (row as { count: number }).count;
}

const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

function sign(
  done: CompletedJob,
  signerName = 'Juno Hartwell',
  token = test.tokens.technician,
  png = signature,
) {
  return jobsAs(test, token).put(
    `${jobPath(done.job.id)}/report/signature`,
    { signerName, signaturePng: png },
    done.job.version,
  );
}

function email(done: CompletedJob, body: object = {}, token = test.tokens.technician) {
  return as(test.app, token).post(`${jobPath(done.job.id)}/report/email`, body);
}

describe('the report’s PDF', () => {
  it('prints the job’s figures, marked as a draft on every page before anyone signs', async () => {
    const done = await completedJob(test, test.tokens.technician);
    const answer = await download(test, test.tokens.technician, `${jobPath(done.job.id)}/report`);
    expect(answer.status).toBe(200);
    expect(answer.headers['content-type']).toBe('application/pdf');
    expect(answer.headers['cache-control']).toBe('no-store');
    const number = `J-${String(done.job.id).padStart(6, '0')}`;
    expect(answer.headers['content-disposition']).toBe(`attachment; filename="report-${number}-draft.pdf"`);
    expect(answer.headers['x-report-revision']).toBe('draft');
    const pages = await pdfPages(answer.body as Buffer);
    expect(pages.length).toBeGreaterThan(1);
    pages.forEach((page, index) => {
      expect(page, `page ${index + 1}`).toContain('Draft, not signed');
      expect(page, `page ${index + 1}`).toContain(number);
      expect(page, `page ${index + 1}`).toContain(`Page ${index + 1} of ${pages.length}`);
    });
    // pdfjs splits words at hyphens and slashes ("SN- j1-…"); read the text without those spaces.
    const whole = pages.join(' ').replace(/([-/]) /g, '$1');
    expect(whole).toContain(done.serialNumber);
    expect(whole).toContain('Hours 1460');
    expect(whole).toContain('Alder Fan Works');
    const [side] = done.job.completion!['beforeAfter'] as {
      before: { amplitude: number };
      after: { amplitude: number };
    }[];
    expect(whole).toContain(
      `Left ${formatFigure(side!.before.amplitude)} 60° 2150 ${formatFigure(side!.after.amplitude)}`,
    );
    expect(whole).toContain('in/s peak');
    expect(whole).toContain(
      `W1 Plane (correction 1) ${formatFigure(done.weight.massGrams, 4)} ${done.weight.angleDeg}° 210 Welded`,
    );
    expect(whole).toContain(`W1: ${done.weight.massGrams} g at ${done.weight.angleDeg}°, 210 mm, welded`);
    expect(whole).toContain('Shop target: 0.15 in/s peak or less on each side');
    expect(whole).toContain('set for the machine family');
    expect(whole).toContain('Met on every side');
    expect(whole).toContain('Bearing end play 0.42 0.3 Over the limit');
    expect(whole).toContain(`Reason: ${OVERRIDE_REASON}`);
    expect(whole).toContain('manufacturer’s operator and service manuals');
  });

  it('answers 404 to another organisation, on every report route, and stores nothing', async () => {
    const done = await completedJob(test, test.tokens.technician);
    const path = jobPath(done.job.id);
    const other = as(test.app, test.otherOwner);
    expect((await download(test, test.otherOwner, `${path}/report`)).status).toBe(404);
    expect((await other.get(`${path}/reports`)).status).toBe(404);
    expect((await sign(done, 'Someone Else', test.otherOwner)).status).toBe(404);
    expect((await other.post(`${path}/report/email`, { to: 'someone@elsewhere.test' })).status).toBe(404);
    const list = JobReportsSchema.parse((await as(test.app, test.tokens.owner).get(`${path}/reports`)).body);
    expect(list.revisions).toEqual([]);
    expect(list.sendings).toEqual([]);
  });

  it('lets every role that reads reports download it, and only the job’s technician or a manager sign', async () => {
    const done = await completedJob(test, test.tokens.technician);
    const path = jobPath(done.job.id);
    for (const role of ['owner', 'manager', 'technician', 'viewer'] as const) {
      expect((await download(test, test.tokens[role], `${path}/report`)).status, role).toBe(200);
    }
    expect((await download(test, test.tokens.developer, `${path}/report`)).status).toBe(403);
    expect((await sign(done, 'Juno Hartwell', test.tokens.viewer)).status).toBe(403);
    const second = await secondTechnician(test);
    const refused = await sign(done, 'Juno Hartwell', second.token);
    expect(refused.status).toBe(403);
    expect(refused.body.code).toBe('NOT_YOUR_JOB');
    expect((await sign(done, 'Juno Hartwell', test.tokens.manager)).status).toBe(201);
  });
});

describe('signing', () => {
  it('freezes revision 1 with the signer’s name, which the download then gives', async () => {
    const done = await completedJob(test, test.tokens.technician);
    const path = jobPath(done.job.id);
    const signed = await sign(done);
    expect(signed.status, JSON.stringify(signed.body)).toBe(201);
    const list = JobReportsSchema.parse(signed.body);
    expect(list).toMatchObject({
      signable: true,
      signedCurrent: true,
      revisions: [{ revision: 1, current: true }],
    });
    expect(list.revisions[0]).toMatchObject({
      signerName: 'Juno Hartwell',
      signedBy: { id: test.own.people.technician.id },
      jobVersion: done.job.version,
    });
    const pdf = await download(test, test.tokens.viewer, `${path}/report`);
    expect(pdf.headers['x-report-revision']).toBe('1');
    expect(pdf.headers['content-disposition']).toContain(
      `report-J-${String(done.job.id).padStart(6, '0')}-r1.pdf`,
    );
    expect(sha256(pdf.body as Buffer)).toBe(list.revisions[0]!.pdfSha256);
    const pages = await pdfPages(pdf.body as Buffer);
    const whole = pages.join(' ');
    expect(whole).toContain('Signed by Juno Hartwell');
    expect(whole).not.toContain('Draft, not signed');
    pages.forEach((page) => expect(page).toContain('signed revision 1'));
  });

  it('refuses a job that is not completed (409), a missing If-Match (428) and an old version (412)', async () => {
    const open = await jobsAs(test, test.tokens.technician).create({
      machineId: (await completedJob(test, test.tokens.technician)).machineId,
      scheduledFor: '2026-05-06',
    });
    const notDone = await jobsAs(test, test.tokens.technician).put(
      `${jobPath(open.body.id)}/report/signature`,
      { signerName: 'Juno Hartwell', signaturePng: signature },
      open.body.version,
    );
    expect(notDone.status).toBe(409);
    expect(notDone.body.code).toBe('JOB_NOT_COMPLETED');
    const done = await completedJob(test, test.tokens.technician);
    const path = `${jobPath(done.job.id)}/report/signature`;
    const noVersion = await jobsAs(test, test.tokens.technician).put(path, {
      signerName: 'Juno Hartwell',
      signaturePng: signature,
    });
    expect(noVersion.status).toBe(428);
    const old = await jobsAs(test, test.tokens.technician).put(
      path,
      { signerName: 'Juno Hartwell', signaturePng: signature },
      done.job.version - 1,
    );
    expect(old.status).toBe(412);
    expect(old.body.current.id).toBe(done.job.id);
    expect(rowsOfJob('job_reports', done.job.id)).toBe(0);
  });

  it('refuses every bad signature with a problem on signaturePng, and stores nothing', async () => {
    const done = await completedJob(test, test.tokens.technician);
    const jpeg = await sharp({ create: { width: 60, height: 20, channels: 3, background: '#222222' } })
      .jpeg()
      .toBuffer();
    const huge = await sharp({ create: { width: 3000, height: 1500, channels: 4, background: '#00000000' } })
      .composite([
        {
          input: { create: { width: 10, height: 10, channels: 4, background: '#000000ff' } },
          left: 5,
          top: 5,
        },
      ])
      .png()
      .toBuffer();
    const before = rowCount(test, 'job_reports');
    const cases: [string, string][] = [
      [
        'not a PNG',
        `data:image/png;base64,${Buffer.from('just some text, not an image').toString('base64')}`,
      ],
      ['JPEG data labelled PNG', `data:image/png;base64,${jpeg.toString('base64')}`],
      ['an empty pad', await signatureDataUrl({ drawn: false })],
      ['too many pixels', `data:image/png;base64,${huge.toString('base64')}`],
      ['not a data URL', 'https://elsewhere.test/signature.png'],
      ['too long', `data:image/png;base64,${'A'.repeat(2_000_004)}`],
    ];
    for (const [what, png] of cases) {
      const answer = await sign(done, 'Juno Hartwell', test.tokens.technician, png);
      expect(answer.status, what).toBe(400);
      expect(answer.headers['content-type'], what).toContain('application/problem+json');
      expect(
        answer.body.errors.map((error: { path: string }) => error.path),
        what,
      ).toEqual(['signaturePng']);
    }
    const noName = await sign(done, '   ');
    expect(noName.status).toBe(400);
    expect(noName.body.errors[0].path).toBe('signerName');
    expect(rowCount(test, 'job_reports')).toBe(before);
  });

  it('makes a new revision after the job’s records change, and the old one stays exactly as signed', async () => {
    const done = await completedJob(test, test.tokens.technician);
    const path = jobPath(done.job.id);
    expect((await sign(done, 'Juno Hartwell')).status).toBe(201);
    const first = (await download(test, test.tokens.technician, `${path}/report`)).body as Buffer;

    const owner = as(test.app, test.tokens.owner);
    const machine = await owner.get(`/api/v1/machines/${done.machineId}`);
    const changed = await owner.patch(
      `/api/v1/machines/${done.machineId}`,
      { hours: 1502 },
      machine.headers['etag'],
    );
    expect(changed.status, JSON.stringify(changed.body)).toBe(200);

    const stale = JobReportsSchema.parse((await owner.get(`${path}/reports`)).body);
    expect(stale.signedCurrent).toBe(false);
    expect(stale.revisions[0]!.current).toBe(false);
    const draft = await download(test, test.tokens.technician, `${path}/report`);
    expect(draft.headers['x-report-revision']).toBe('draft');
    expect((await pdfPages(draft.body as Buffer)).join(' ')).toContain('Hours 1502');

    expect((await sign(done, 'Rowan Hartwell')).status).toBe(201);
    const list = JobReportsSchema.parse((await owner.get(`${path}/reports`)).body);
    expect(list.revisions.map((revision) => [revision.revision, revision.current])).toEqual([
      [2, true],
      [1, false],
    ]);
    const latest = await download(test, test.tokens.technician, `${path}/report`);
    expect(latest.headers['x-report-revision']).toBe('2');
    expect((await pdfPages(latest.body as Buffer)).join(' ')).toContain('Signed by Rowan Hartwell');
    const old = await download(test, test.tokens.technician, `${path}/report?revision=1`);
    expect(old.headers['x-report-revision']).toBe('1');
    expect(Buffer.compare(old.body as Buffer, first)).toBe(0);
    expect((await pdfPages(old.body as Buffer)).join(' ')).toContain('Hours 1460');
    expect((await download(test, test.tokens.technician, `${path}/report?revision=9`)).status).toBe(404);
    expect((await download(test, test.tokens.technician, `${path}/report?revision=zero`)).status).toBe(400);
  });

  it('numbers parallel signings 1, 2, 3 and keeps every one of them', async () => {
    const done = await completedJob(test, test.tokens.technician);
    const names = ['Juno Hartwell', 'Rowan Hartwell', 'Sage Hartwell'];
    const answers = await Promise.all(names.map((name) => sign(done, name)));
    expect(answers.map((answer) => answer.status)).toEqual([201, 201, 201]);
    const list = JobReportsSchema.parse(
      (await as(test.app, test.tokens.owner).get(`${jobPath(done.job.id)}/reports`)).body,
    );
    expect(list.revisions.map((revision) => revision.revision)).toEqual([3, 2, 1]);
    expect(new Set(list.revisions.map((revision) => revision.signerName))).toEqual(new Set(names));
  });
});

describe('e-mailing the report', () => {
  it('refuses an unsigned report (409) and a customer without an address (400 on to)', async () => {
    const done = await completedJob(test, test.tokens.technician);
    const unsigned = await email(done);
    expect(unsigned.status).toBe(409);
    expect(unsigned.body.code).toBe('REPORT_NOT_SIGNED');
    expect((await sign(done)).status).toBe(201);
    const owner = as(test.app, test.tokens.owner);
    const customer = await owner.get(`/api/v1/customers/${done.customerId}`);
    expect(
      (await owner.patch(`/api/v1/customers/${done.customerId}`, { email: null }, customer.headers['etag']))
        .status,
    ).toBe(200);
    // The address is part of what the report prints: the customer signs the changed report again.
    expect((await sign(done)).status).toBe(201);
    const noAddress = await email(done);
    expect(noAddress.status).toBe(400);
    expect(noAddress.body.errors).toEqual([
      { path: 'to', message: expect.stringContaining('no e-mail address') },
    ]);
    const badAddress = await email(done, { to: 'not an address' });
    expect(badAddress.status).toBe(400);
    expect(badAddress.body.errors[0].path).toBe('to');
    expect(rowsOfJob('job_report_sendings', done.job.id)).toBe(0);
  });

  it('sends the signed PDF, records the sending, and the owner opens the attachment from the Outbox', async () => {
    const done = await completedJob(test, test.tokens.technician);
    const path = jobPath(done.job.id);
    const signed = JobReportsSchema.parse((await sign(done)).body);
    const sent = await email(done, { to: 'Yard.Office@Fernhollow.test' });
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
    const sending = ReportSendingSchema.parse(sent.body);
    expect(sending).toMatchObject({
      to: 'yard.office@fernhollow.test',
      revision: 1,
      sentBy: { id: test.own.people.technician.id },
    });
    expect(sending.messageId).toMatch(/^<report-J-\d{6}-r1-[0-9a-f-]+@counterpoise\.local>$/);
    const list = JobReportsSchema.parse((await as(test.app, test.tokens.viewer).get(`${path}/reports`)).body);
    expect(list.sendings).toEqual([sending]);

    const outbox = OutboxSchema.parse((await as(test.app, test.tokens.owner).get('/api/v1/outbox')).body);
    const message = outbox.messages.find((candidate) =>
      candidate.to.includes('yard.office@fernhollow.test'),
    )!;
    expect(message.subject).toContain(list.jobNumber);
    expect(message.text).toContain('revision 1, signed by Juno Hartwell');
    expect(message.attachments).toEqual([
      {
        id: expect.any(Number),
        filename: `report-${list.jobNumber}-r1.pdf`,
        contentType: 'application/pdf',
        byteSize: signed.revisions[0]!.byteSize,
      },
    ]);
    const attachmentPath = `/api/v1/outbox/${message.id}/attachments/${message.attachments[0]!.id}`;
    const file = await download(test, test.tokens.owner, attachmentPath);
    expect(file.status).toBe(200);
    expect(file.headers['content-type']).toBe('application/pdf');
    expect(file.headers['content-disposition']).toBe(
      `attachment; filename="report-${list.jobNumber}-r1.pdf"`,
    );
    expect(file.headers['x-content-type-options']).toBe('nosniff');
    expect(sha256(file.body as Buffer)).toBe(signed.revisions[0]!.pdfSha256);
    expect((await pdfPages(file.body as Buffer)).join(' ')).toContain('Signed by Juno Hartwell');

    expect((await download(test, test.otherOwner, attachmentPath)).status).toBe(404);
    expect((await download(test, test.tokens.technician, attachmentPath)).status).toBe(403);
    expect(
      (
        await download(
          test,
          test.tokens.owner,
          `/api/v1/outbox/${message.id + 1000}/attachments/${message.attachments[0]!.id}`,
        )
      ).status,
    ).toBe(404);
  });

  it('sends to the customer’s address on record, refuses an outdated revision unless named, and records parallel sendings', async () => {
    const done = await completedJob(test, test.tokens.technician);
    const path = jobPath(done.job.id);
    expect((await sign(done)).status).toBe(201);
    const owner = as(test.app, test.tokens.owner);
    const customer = (await owner.get(`/api/v1/customers/${done.customerId}`)).body as { email: string };
    const answers = await Promise.all([1, 2, 3, 4].map(() => email(done, {}, test.tokens.manager)));
    expect(answers.map((answer) => answer.status)).toEqual([201, 201, 201, 201]);
    expect(new Set(answers.map((answer) => answer.body.messageId)).size).toBe(4);
    const list = JobReportsSchema.parse((await owner.get(`${path}/reports`)).body);
    expect(list.sendings.map((sending) => sending.to)).toEqual([
      customer.email,
      customer.email,
      customer.email,
      customer.email,
    ]);
    const outbox = OutboxSchema.parse((await owner.get('/api/v1/outbox')).body);
    expect(outbox.messages.filter((message) => message.to.includes(customer.email))).toHaveLength(4);

    const machine = await owner.get(`/api/v1/machines/${done.machineId}`);
    expect(
      (await owner.patch(`/api/v1/machines/${done.machineId}`, { hours: 1600 }, machine.headers['etag']))
        .status,
    ).toBe(200);
    const outdated = await email(done);
    expect(outdated.status).toBe(409);
    expect(outdated.body.code).toBe('REPORT_OUTDATED');
    const named = await email(done, { revision: 1 });
    expect(named.status).toBe(201);
    expect((await email(done, { revision: 5 })).body.errors[0].path).toBe('revision');
  });
});
