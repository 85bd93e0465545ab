/*
 * The examples of the report routes in the OpenAPI document. A spec parses each with its schema. Invented
 * people of the demo organisation, on the reserved `.test` domain.
 */

/** A 4 × 2 PNG, two black dots on a transparent pad: a drawing as small as the route takes. */
const SMALL_DRAWING_PNG =
  'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAQAAAACCAYAAAB/qH1jAAAACXBIWXMAAAPoAAAD6AG1e1JrAAAAEUlEQVQI12NgYGD4z4AFwAUBJvsB/zqmEvQAAAAASUVORK5CYII=';

export const SIGN_REPORT_EXAMPLE = { signerName: 'Juno Hartwell', signaturePng: SMALL_DRAWING_PNG };

export const JOB_REPORTS_EXAMPLE = {
  jobId: 42,
  jobNumber: 'J-000042',
  signable: true,
  signedCurrent: true,
  customerEmail: 'office@fernhollow-clearing.test',
  revisions: [
    {
      revision: 1,
      jobVersion: 14,
      signerName: 'Juno Hartwell',
      signedAt: '2026-05-04T09:10:00.000Z',
      signedBy: { id: 3, name: 'Tamsin Reyes' },
      pdfSha256: '4f2a0c1e9b7d5a3f8e6c4b2a0f9e8d7c6b5a4f3e2d1c0b9a8f7e6d5c4b3a2f1e',
      byteSize: 48213,
      current: true,
      fileName: 'report-J-000042-r1.pdf',
    },
  ],
  sendings: [
    {
      id: 7,
      to: 'office@fernhollow-clearing.test',
      revision: 1,
      messageId: '<report-J-000042-r1-3b1f6a52-8f0e-4c59-9d61-0a4be2f1c7d3@counterpoise.local>',
      sentAt: '2026-05-04T09:12:00.000Z',
      sentBy: { id: 3, name: 'Tamsin Reyes' },
    },
  ],
};

export const REPORT_SENDING_EXAMPLE = JOB_REPORTS_EXAMPLE.sendings[0]!;
