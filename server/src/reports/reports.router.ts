import {
  EmailReportSchema,
  JobReportsSchema,
  ReportQuerySchema,
  ReportSendingSchema,
  SignReportSchema,
} from '@counterpoise/api';
import type { Response } from 'express';
import { IdParamSchema } from '../http/params';
import { type AccessRule, type FeatureRoutes, RouteTable } from '../http/route';
import { IF_MATCH_HEADERS, PROBLEMS as JOB_PROBLEMS } from '../jobs/jobs.router';
import type { JobActor } from '../jobs/jobs.service';
import { RECORDS_BASE_PATH } from '../records/record-routes';
import { ifMatchVersions, requireIfMatch } from '../records/versions';
import { JOB_REPORTS_EXAMPLE, REPORT_SENDING_EXAMPLE, SIGN_REPORT_EXAMPLE } from './reports.examples';
import type { ReportsService } from './reports.service';

/**
 * Who may call a report route: read (`reports:read`: download and list), write (`jobs:write`: the
 * technician of the job, or anyone who also holds `jobs:write-any`, has the customer sign and sends it).
 */
export type ReportAccess = 'read' | 'write';

const NOT_FOUND = JOB_PROBLEMS[404];
const FORBIDDEN = JOB_PROBLEMS[403];

/** The signed-in person of a request that passed the guard. */
function actorOf(res: Response): JobActor {
  const user = res.locals.user;
  if (user === undefined) throw new Error('The report routes run behind requireUser.');
  return user;
}

/** The report routes under `/api/v1/jobs/{id}`, on the signed-in router; access comes from the app. */
export function reportsRouter(deps: {
  access: Readonly<Record<ReportAccess, AccessRule>>;
  reports: ReportsService;
}): FeatureRoutes {
  const { reports } = deps;
  const table = new RouteTable({ basePath: RECORDS_BASE_PATH, tag: 'Reports', access: deps.access });
  table
    .add({
      method: 'get',
      path: '/jobs/{id}/report',
      summary: 'The job’s service report as a PDF',
      description:
        'The latest signed revision while the job still reads as it did when signed; otherwise a draft built ' +
        'now and marked “Draft, not signed” on every page. `?revision=N` gives revision N exactly as signed. ' +
        'The file name says which (`report-J-000123-r2.pdf`, `report-J-000123-draft.pdf`).',
      access: 'read',
      params: IdParamSchema,
      query: ReportQuerySchema,
      answer: {
        status: 200,
        description: 'The PDF.',
        headers: {
          'Content-Disposition': {
            description: 'A download, with the file name of the revision or draft.',
            schema: { type: 'string', example: 'attachment; filename="report-J-000123-r2.pdf"' },
          },
          'X-Report-Revision': {
            description: 'The revision sent, or `draft`.',
            schema: { type: 'string', example: '2' },
          },
        },
        content: { 'application/pdf': { schema: { type: 'string', format: 'binary' } } },
      },
      problems: { 404: `${NOT_FOUND} Also when \`revision\` names a revision the report does not have.` },
      handle: async ({ params, query, res }) => {
        const file = await reports.pdf(actorOf(res), params.id, query.revision);
        res
          .status(200)
          .set({
            'Cache-Control': 'no-store',
            'Content-Disposition': `attachment; filename="${file.fileName}"`,
            'X-Content-Type-Options': 'nosniff',
            'X-Report-Revision': file.revision === null ? 'draft' : String(file.revision),
          })
          .type('application/pdf')
          .send(file.bytes);
        return undefined;
      },
    })
    .add({
      method: 'get',
      path: '/jobs/{id}/reports',
      summary: 'The signed revisions of the job’s report and its sendings',
      description:
        'Newest first; `current` says whether a revision still matches the job, `signable` whether the job is ' +
        'completed, and `customerEmail` where the report goes by default.',
      access: 'read',
      params: IdParamSchema,
      answer: {
        status: 200,
        description: 'The revisions and sendings.',
        schema: JobReportsSchema,
        example: JOB_REPORTS_EXAMPLE,
      },
      problems: { 404: NOT_FOUND },
      handle: ({ params, res }) => {
        res.set('Cache-Control', 'no-store');
        return reports.list(actorOf(res), params.id);
      },
    })
    .add({
      method: 'put',
      path: '/jobs/{id}/report/signature',
      summary: 'The customer signs the report',
      description:
        'The signer’s name and the drawing as a PNG data URL (as signature_pad gives it). The server reads the ' +
        'PNG from its content (not its label), limits its size (1 MB, 4096 px a side, 4 million pixels), refuses ' +
        'an empty pad, and encodes it again; then it builds the report and freezes it as the next revision ' +
        '(1, 2, …) with the signature, the job’s version and the hash of what it printed. Every earlier ' +
        'revision stays downloadable as signed. Only a completed job; send the job’s ETag in `If-Match`: ' +
        'without it 428, on a version that is no longer the job’s 412 with the job as stored.',
      access: 'write',
      params: IdParamSchema,
      headers: IF_MATCH_HEADERS,
      before: [requireIfMatch],
      body: SignReportSchema,
      bodyExample: SIGN_REPORT_EXAMPLE,
      bodyLimit: '2100kb',
      answer: {
        status: 201,
        description: 'The report’s revisions and sendings, the new revision first.',
        schema: JobReportsSchema,
        example: JOB_REPORTS_EXAMPLE,
      },
      problems: {
        403: FORBIDDEN,
        404: NOT_FOUND,
        409: 'The job is not completed (`JOB_NOT_COMPLETED`).',
        412: 'The job changed since the version in `If-Match` (`CHANGED_MEANWHILE`); `current` holds it as stored.',
        428: 'No `If-Match` header (`VERSION_REQUIRED`).',
      },
      handle: async ({ params, body, res }) =>
        reports.sign(actorOf(res), params.id, ifMatchVersions(res.locals), body),
    })
    .add({
      method: 'post',
      path: '/jobs/{id}/report/email',
      summary: 'Send the signed report by e-mail, the PDF attached',
      description:
        'Sends the latest signed revision (or the one named in `revision`, as signed) to `to`, or to the ' +
        'customer’s e-mail address on record, and records the sending (to, revision, who, when, Message-ID). ' +
        'An unsigned report is not sent: 409 `REPORT_NOT_SIGNED`; when the job changed since the latest ' +
        'revision was signed, 409 `REPORT_OUTDATED` (have the customer sign again, or name the revision).',
      access: 'write',
      params: IdParamSchema,
      body: EmailReportSchema,
      bodyExample: { to: 'office@fernhollow-clearing.test' },
      answer: {
        status: 201,
        description: 'The sending as recorded.',
        schema: ReportSendingSchema,
        example: REPORT_SENDING_EXAMPLE,
      },
      problems: {
        403: FORBIDDEN,
        404: NOT_FOUND,
        409: 'The job is not completed (`JOB_NOT_COMPLETED`), the report is not signed (`REPORT_NOT_SIGNED`), or the job changed since the latest revision was signed (`REPORT_OUTDATED`).',
        502: 'The mail server did not take the message (`MAIL_NOT_SENT`); nothing was recorded.',
      },
      handle: async ({ params, body, res }) => reports.email(actorOf(res), params.id, body),
    });
  return table;
}
