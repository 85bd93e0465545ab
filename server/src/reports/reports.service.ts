import { createHash, randomUUID } from 'node:crypto';
import {
  can,
  type EmailReport,
  type Job,
  JOBS_PROBLEM_CODES,
  type JobReports,
  jobNumber,
  REPORTS_PROBLEM_CODES,
  reportFileName,
  type ReportSending,
  type SignReport,
} from '@counterpoise/api';
import type { Clock } from '../clock';
import { HttpProblem } from '../http/problem';
import type { JobActor, JobsService } from '../jobs/jobs.service';
import { composeMail, type Mailer } from '../mail/mailer';
import { checkVersion } from '../records/versions';
import { buildReportPdf, formatTime } from './report-pdf';
import { type ReportSource, reportSourceOf, sourceSha256 } from './report-source';
import type { ReportsRepo, ReportSummaryRow } from './reports.repo';
import { readSignature } from './signature';

/** A report's PDF as the download sends it. */
export interface ReportFile {
  readonly bytes: Buffer;
  readonly fileName: string;
  /** The revision, or null for a draft. */
  readonly revision: number | null;
}

/** How often a signing tries again when another signing took its revision number meanwhile. */
const SIGNING_ATTEMPTS = 5;

function conflict(detail: string, code: string): HttpProblem {
  return new HttpProblem(409, 'Conflict', detail, undefined, 'about:blank', code);
}

function badField(path: string, message: string, code: string): HttpProblem {
  return new HttpProblem(400, 'Bad Request', `${path}: ${message}`, [{ path, message }], 'about:blank', code);
}

/**
 * The service report of a job: built from the job and its records, signed by the customer (each signing
 * freezes a revision: the PDF, the signature and the hash of what it printed), downloaded, and sent by
 * e-mail with the PDF attached, every sending recorded.
 */
export class ReportsService {
  /** The signing under way per job: signings of one job run one after the other in this process. */
  private readonly signings = new Map<number, Promise<unknown>>();

  constructor(
    private readonly jobs: JobsService,
    private readonly repo: ReportsRepo,
    private readonly mailer: Mailer,
    private readonly clock: Clock,
  ) {}

  /** The job (404 when not the organisation's) and what its report prints now. */
  private current(actor: JobActor, jobId: number): { job: Job; source: ReportSource; sha256: string } {
    const job = this.jobs.get(actor, jobId);
    const machine = this.repo.findMachine(actor.organisationId, job.machine.id);
    const customer = this.repo.findCustomer(actor.organisationId, job.machine.customerId);
    if (machine === undefined || customer === undefined)
      throw new Error(`Job ${jobId} names no machine or customer.`);
    const family =
      machine.familyId === null ? undefined : this.repo.findFamily(actor.organisationId, machine.familyId);
    const source = reportSourceOf(job, {
      shopName: this.repo.organisationName(actor.organisationId),
      customer: {
        name: customer.name,
        siteAddress: customer.siteAddress,
        email: customer.email,
        phone: customer.phone,
        contacts: customer.contacts,
      },
      machine: {
        hours: machine.hours,
        rotorMassKg: machine.rotorMassKg,
        planes: machine.planes,
        acceptance: machine.acceptance,
      },
      family: family === undefined ? null : { acceptance: family.acceptance },
    });
    return { job, source, sha256: sourceSha256(source) };
  }

  /** The job's revisions and sendings. */
  list(actor: JobActor, jobId: number): JobReports {
    const { job, source, sha256 } = this.current(actor, jobId);
    const names = this.repo.peopleNames(actor.organisationId);
    const person = (id: number) => ({ id, name: names.get(id) ?? 'Unknown person' });
    const revisions = this.repo.revisions(actor.organisationId, jobId);
    return {
      jobId: job.id,
      jobNumber: source.jobNumber,
      signable: job.status === 'completed',
      signedCurrent: revisions[0]?.sourceSha256 === sha256,
      customerEmail: source.customer.email,
      revisions: revisions.map((row) => revisionOf(row, sha256, person)),
      sendings: this.repo.sendings(actor.organisationId, jobId).map((row) => ({
        id: row.id,
        to: row.to,
        revision: row.revision,
        messageId: row.messageId,
        sentAt: row.sentAt.toISOString(),
        sentBy: person(row.sentById),
      })),
    };
  }

  /**
   * The report's PDF: revision `revision` exactly as signed (404 when there is none), else the latest
   * revision while it still matches the job, else a draft built now and marked unsigned on every page.
   */
  async pdf(actor: JobActor, jobId: number, revision?: number): Promise<ReportFile> {
    const { source, sha256 } = this.current(actor, jobId);
    const stored = this.repo.findRevision(actor.organisationId, jobId, revision);
    if (revision !== undefined && stored === undefined) {
      throw new HttpProblem(
        404,
        'Not Found',
        `The report of job ${source.jobNumber} has no revision ${revision}.`,
      );
    }
    if (stored !== undefined && (revision !== undefined || stored.sourceSha256 === sha256)) {
      return {
        bytes: stored.pdf,
        fileName: reportFileName(jobId, stored.revision),
        revision: stored.revision,
      };
    }
    return {
      bytes: await buildReportPdf(source, null),
      fileName: reportFileName(jobId, null),
      revision: null,
    };
  }

  /**
   * The customer signs: only a completed job (409 `JOB_NOT_COMPLETED`), on the version of the job the
   * screen showed (412 otherwise), by its technician or a manager (403). The signature is checked and
   * encoded again, then the report is built and frozen as the next revision. Signings of one job run one
   * after the other; should another process have taken the number meanwhile, the revision is built again
   * under the next one.
   */
  async sign(
    actor: JobActor,
    jobId: number,
    versions: readonly number[],
    body: SignReport,
  ): Promise<JobReports> {
    const { job } = this.current(actor, jobId);
    this.checkWriter(actor, job);
    checkVersion(job, versions, 'job');
    this.checkCompleted(job);
    const png = await readSignature(body.signaturePng);
    await this.oneAtATime(jobId, async () => {
      for (let attempt = 0; attempt < SIGNING_ATTEMPTS; attempt++) {
        const { source, sha256 } = this.current(actor, jobId);
        const revision = this.repo.nextRevision(actor.organisationId, jobId);
        const signedAt = this.clock.now();
        const pdf = await buildReportPdf(source, {
          revision,
          signerName: body.signerName,
          signedAt: signedAt.toISOString(),
          png,
        });
        const stored = this.repo.insertRevision(revision, {
          organisationId: actor.organisationId,
          jobId,
          jobVersion: source.jobVersion,
          sourceSha256: sha256,
          signerName: body.signerName,
          signaturePng: png,
          pdf,
          pdfSha256: createHash('sha256').update(pdf).digest('hex'),
          signedById: actor.id,
          signedAt,
        });
        if (stored) return;
      }
      throw conflict(
        'Other signings of this report kept taking the next revision: sign once more.',
        REPORTS_PROBLEM_CODES.signingBusy,
      );
    });
    return this.list(actor, jobId);
  }

  /**
   * Sends a signed revision by e-mail with its PDF attached: the one named, else the latest, which must
   * still match the job (409 `REPORT_OUTDATED`); an unsigned report is not sent (409 `REPORT_NOT_SIGNED`).
   * To the address given, else the customer's (400 on `to` when there is none). The sending is recorded
   * once the mail server has taken the message.
   */
  async email(actor: JobActor, jobId: number, body: EmailReport & { to?: string }): Promise<ReportSending> {
    const { job, source, sha256 } = this.current(actor, jobId);
    this.checkWriter(actor, job);
    this.checkCompleted(job);
    const stored = this.repo.findRevision(actor.organisationId, jobId, body.revision);
    if (body.revision !== undefined && stored === undefined) {
      throw badField(
        'revision',
        `The report has no revision ${body.revision}.`,
        REPORTS_PROBLEM_CODES.reportNotSigned,
      );
    }
    if (stored === undefined) {
      throw conflict(
        'The report is not signed yet: have the customer sign it, then send it.',
        REPORTS_PROBLEM_CODES.reportNotSigned,
      );
    }
    if (body.revision === undefined && stored.sourceSha256 !== sha256) {
      throw conflict(
        `The job changed since revision ${stored.revision} was signed: have the customer sign the report again, ` +
          `or name revision ${stored.revision} to send it as it was signed.`,
        REPORTS_PROBLEM_CODES.reportOutdated,
      );
    }
    const to = body.to ?? source.customer.email;
    if (to === undefined || to === null) {
      throw badField(
        'to',
        `${source.customer.name} has no e-mail address on record: enter the address to send the report to.`,
        REPORTS_PROBLEM_CODES.noAddress,
      );
    }
    const machine = [source.machine.make, source.machine.model].filter(Boolean).join(' ');
    const serial = source.machine.serialNumber ? `, serial ${source.machine.serialNumber}` : '';
    const paragraphs = [
      'Hello,',
      `${source.shopName} sends you the service report of job ${source.jobNumber} (field balancing of ` +
        `${machine || 'your machine'}${serial}), revision ${stored.revision}, signed by ${stored.signerName} on ` +
        `${formatTime(stored.signedAt.toISOString())}.`,
      'The report is attached as a PDF file.',
      source.shopName,
    ];
    const messageId = `<report-${jobNumber(jobId)}-r${stored.revision}-${randomUUID()}@counterpoise.local>`;
    try {
      await this.mailer.send({
        organisationId: actor.organisationId,
        to,
        subject: `Service report ${source.jobNumber} from ${source.shopName}`,
        ...composeMail(paragraphs),
        attachments: [
          {
            filename: reportFileName(jobId, stored.revision),
            contentType: 'application/pdf',
            content: stored.pdf,
          },
        ],
        messageId,
      });
    } catch {
      throw new HttpProblem(
        502,
        'Bad Gateway',
        'The mail server did not take the message; nothing was sent. Try again in a moment.',
        undefined,
        'about:blank',
        REPORTS_PROBLEM_CODES.mailNotSent,
      );
    }
    const sentAt = this.clock.now();
    const id = this.repo.insertSending({
      organisationId: actor.organisationId,
      jobId,
      reportId: stored.id,
      to,
      messageId,
      sentById: actor.id,
      sentAt,
    });
    const names = this.repo.peopleNames(actor.organisationId);
    return {
      id,
      to,
      revision: stored.revision,
      messageId,
      sentAt: sentAt.toISOString(),
      sentBy: { id: actor.id, name: names.get(actor.id) ?? 'Unknown person' },
    };
  }

  /** The job's technician, or a person who may change any job (403 `NOT_YOUR_JOB` otherwise). */
  private checkWriter(actor: JobActor, job: Job): void {
    if (job.technician.id !== actor.id && !can(actor.role, 'jobs:write-any')) {
      throw new HttpProblem(
        403,
        'Forbidden',
        'This job is another technician’s: its technician or a manager signs and sends its report.',
        undefined,
        'about:blank',
        JOBS_PROBLEM_CODES.notYourJob,
      );
    }
  }

  private checkCompleted(job: Job): void {
    if (job.status !== 'completed') {
      throw conflict(
        `The job is ${job.status}: only a completed job’s report is signed and sent.`,
        REPORTS_PROBLEM_CODES.jobNotCompleted,
      );
    }
  }

  /** Runs `work` after every earlier signing of the same job has ended. */
  private async oneAtATime<T>(jobId: number, work: () => Promise<T>): Promise<T> {
    const before = this.signings.get(jobId) ?? Promise.resolve();
    const run = before.then(work, work);
    const settled = run.catch(() => undefined);
    this.signings.set(jobId, settled);
    try {
      return await run;
    } finally {
      if (this.signings.get(jobId) === settled) this.signings.delete(jobId);
    }
  }
}

function revisionOf(
  row: ReportSummaryRow,
  sha256: string,
  person: (id: number) => { id: number; name: string },
): JobReports['revisions'][number] {
  return {
    revision: row.revision,
    jobVersion: row.jobVersion,
    signerName: row.signerName,
    signedAt: row.signedAt.toISOString(),
    signedBy: person(row.signedById),
    pdfSha256: row.pdfSha256,
    byteSize: row.byteSize,
    current: row.sourceSha256 === sha256,
    fileName: reportFileName(row.jobId, row.revision),
  };
}
