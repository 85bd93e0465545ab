import type { JobReports } from './reports.api';

/*
 * The report of a job as the demo server answers it, for the specs of the report panel and its dialogs.
 * Invented people and addresses of the demo shop.
 */

/** A completed job's report before anyone signs. */
export function unsignedReports(jobId: number): JobReports {
  return {
    jobId,
    jobNumber: `J-${String(jobId).padStart(6, '0')}`,
    signable: true,
    signedCurrent: false,
    customerEmail: 'office@aldercreek-clearing.test',
    revisions: [],
    sendings: [],
  };
}

/** The same report after one signing (revision 1, current) and one sending. */
export function signedReports(jobId: number): JobReports {
  const base = unsignedReports(jobId);
  return {
    ...base,
    signedCurrent: true,
    revisions: [
      {
        revision: 1,
        jobVersion: 10,
        signerName: 'Juno Hartwell',
        signedAt: '2026-12-05T09:10:00.000Z',
        signedBy: { id: 3, name: 'Tomasz Wrenfield' },
        pdfSha256: 'a'.repeat(64),
        byteSize: 45120,
        current: true,
        fileName: `report-${base.jobNumber}-r1.pdf`,
      },
    ],
    sendings: [
      {
        id: 4,
        to: 'office@aldercreek-clearing.test',
        revision: 1,
        messageId: `<report-${base.jobNumber}-r1-1@counterpoise.local>`,
        sentAt: '2026-12-05T09:12:00.000Z',
        sentBy: { id: 3, name: 'Tomasz Wrenfield' },
      },
    ],
  };
}
