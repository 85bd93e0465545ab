import * as z from 'zod';
import { displayName } from './display-name';

/*
 * The service report of a completed job: the customer's signature, the signed revisions (each frozen as
 * signed), and the sendings of the report by e-mail. The routes and what the report holds:
 * docs/reports.md.
 */

/** The job's number as the report and its file name write it: `J-000123`. */
export function jobNumber(jobId: number): string {
  return `J-${String(jobId).padStart(6, '0')}`;
}

/** The file name of a report: `report-J-000123-r2.pdf` for revision 2, `report-J-000123-draft.pdf` unsigned. */
export function reportFileName(jobId: number, revision: number | null): string {
  return `report-${jobNumber(jobId)}-${revision === null ? 'draft' : `r${revision}`}.pdf`;
}

/** Stable `code`s of the reports' problems. */
export const REPORTS_PROBLEM_CODES = {
  /** Only a completed job has a report to sign or send (409). */
  jobNotCompleted: 'JOB_NOT_COMPLETED',
  /** The signature is not a PNG drawing the server can read, is too large, or is empty (400 on `signaturePng`). */
  badSignature: 'BAD_SIGNATURE',
  /** The report was never signed: have the customer sign before sending (409). */
  reportNotSigned: 'REPORT_NOT_SIGNED',
  /** The job changed since its latest revision was signed: sign again, or name the revision to send (409). */
  reportOutdated: 'REPORT_OUTDATED',
  /** No address to send to: the customer has none on record and none was given (400 on `to`). */
  noAddress: 'NO_ADDRESS',
  /** Other signings of the same report kept taking the next revision number (409): sign once more. */
  signingBusy: 'SIGNING_BUSY',
  /** The mail server did not take the message (502); nothing was recorded. */
  mailNotSent: 'MAIL_NOT_SENT',
} as const;

/** The largest signature accepted, as a data URL (about 1.5 MB of PNG). */
export const SIGNATURE_DATA_URL_MAX_LENGTH = 2_000_000;

/** The customer signs the report: their name and the drawing, a PNG data URL as signature_pad gives it. */
export const SignReportSchema = z
  .strictObject({
    signerName: displayName({
      field: 'the signer’s name',
      maxLength: 100,
      missing: 'Enter the name of the person who signs.',
    }),
    signaturePng: z
      .string({ error: 'Draw the signature.' })
      .max(SIGNATURE_DATA_URL_MAX_LENGTH, {
        error: 'The signature is too large: clear it and sign once more.',
      })
      .regex(/^data:image\/png;base64,[A-Za-z0-9+/]+={0,2}$/, {
        error: 'The signature is a PNG image as a data URL (data:image/png;base64,…).',
      })
      .meta({
        description:
          'The drawing as a PNG data URL (`data:image/png;base64,…`), transparent where not drawn.',
      }),
  })
  .meta({ id: 'SignReport' });
export type SignReport = z.input<typeof SignReportSchema>;

/** Send the report by e-mail: to the customer's address on record, or to the one given. */
export const EmailReportSchema = z
  .strictObject({
    to: z
      .email({ error: 'Enter an e-mail address such as name@example.com.' })
      .max(254, { error: 'An e-mail address has at most 254 characters.' })
      .transform((email) => email.toLowerCase())
      .optional()
      .meta({ description: 'Where to send it; the customer’s e-mail address on record when left out.' }),
    revision: z
      .number({ error: 'The revision is a whole number.' })
      .int({ error: 'The revision is a whole number.' })
      .positive({ error: 'The revision is 1 or more.' })
      .optional()
      .meta({ description: 'A signed revision to send as it was signed; the latest when left out.' }),
  })
  .meta({ id: 'EmailReport' });
export type EmailReport = z.input<typeof EmailReportSchema>;

const PersonRefSchema = z.object({ id: z.number().int().positive(), name: z.string() });

/** One signed revision of a job's report, frozen as signed. */
export const ReportRevisionSchema = z
  .object({
    revision: z.number().int().positive(),
    /** The job's version the report was built from. */
    jobVersion: z.number().int().positive(),
    signerName: z.string(),
    signedAt: z.iso.datetime(),
    /** The person signed in when the customer signed (the technician's tablet). */
    signedBy: PersonRefSchema,
    /** The SHA-256 (hex) of the PDF as signed. */
    pdfSha256: z.string(),
    byteSize: z.number().int().positive(),
    /** Whether the job still reads as it did when signed (the latest revision is then the report). */
    current: z.boolean(),
    fileName: z.string(),
  })
  .meta({ id: 'ReportRevision' });
export type ReportRevision = z.infer<typeof ReportRevisionSchema>;

/** One sending of the report by e-mail. */
export const ReportSendingSchema = z
  .object({
    id: z.number().int().positive(),
    to: z.string(),
    /** The revision sent. */
    revision: z.number().int().positive().nullable(),
    messageId: z.string().nullable(),
    sentAt: z.iso.datetime(),
    sentBy: PersonRefSchema,
  })
  .meta({ id: 'ReportSending' });
export type ReportSending = z.infer<typeof ReportSendingSchema>;

/** A job's report: whether it can be signed, its revisions (newest first) and its sendings (newest first). */
export const JobReportsSchema = z
  .object({
    jobId: z.number().int().positive(),
    jobNumber: z.string(),
    /** Only a completed job's report can be signed and sent. */
    signable: z.boolean(),
    /** Whether the latest revision still matches the job (false when none is signed). */
    signedCurrent: z.boolean(),
    /** The customer's e-mail address on record, where the report goes by default. */
    customerEmail: z.string().nullable(),
    revisions: z.array(ReportRevisionSchema),
    sendings: z.array(ReportSendingSchema),
  })
  .meta({ id: 'JobReports' });
export type JobReports = z.infer<typeof JobReportsSchema>;

/** `?revision=N` of the report's download. */
export const ReportQuerySchema = z
  .object({
    revision: z.coerce
      .number({ error: 'The revision is a whole number.' })
      .int({ error: 'The revision is a whole number.' })
      .positive({ error: 'The revision is 1 or more.' })
      .optional(),
  })
  .meta({ id: 'ReportQuery' });
