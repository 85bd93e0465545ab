import { JobsExportQuerySchema, MachineHistorySchema } from '@counterpoise/api';
import type { Response } from 'express';
import { IdParamSchema } from '../http/params';
import { type AccessRule, type FeatureRoutes, RouteTable } from '../http/route';
import type { JobActor } from '../jobs/jobs.service';
import { RECORDS_BASE_PATH } from '../records/record-routes';
import { JOBS_CSV_EXAMPLE, MACHINE_JOB_HISTORY_EXAMPLE } from './machine-history.examples';
import { MachineHistoryService } from './machine-history.service';

/**
 * Who may call a history route: read a machine's job history (`jobs:read`), export the shop's jobs
 * (`reports:read`, as the reports and records are read).
 */
export type MachineHistoryAccess = 'history' | 'export';

/** The path of the export: under `/exports`, so that it never meets `/jobs/{id}`, which takes ids only. */
export const JOBS_EXPORT_PATH = '/exports/jobs.csv';

/** The signed-in person of a request that passed the guard. */
function actorOf(res: Response): JobActor {
  const user = res.locals.user;
  if (user === undefined) throw new Error('The history routes run behind requireUser.');
  return user;
}

/** A machine's job history and the CSV export of the shop's jobs, on the signed-in router. */
export function machineHistoryRouter(deps: {
  access: Readonly<Record<MachineHistoryAccess, AccessRule>>;
  history: MachineHistoryService;
}): FeatureRoutes {
  const { history } = deps;
  const table = new RouteTable({ basePath: RECORDS_BASE_PATH, tag: 'Machine history', access: deps.access });
  return table
    .add({
      method: 'get',
      path: '/machines/{id}/job-history',
      summary: 'Every job on a machine, the weights on its rotor and its family’s sensitivity',
      description:
        'The jobs oldest first, each with its methods, before and after per side (amplitude in the job’s unit, ' +
        'phase, speed), the acceptance limit and whether it was met, and the weights it fitted; every ' +
        'amplitude also in the history’s `unit` (the latest job’s; a job read in the other unit is converted ' +
        'with the engine’s `convertVibration`). The weights now on the rotor are the latest completed job’s ' +
        'list; the family’s sensitivities are those stored on the family, refined by every completed job. ' +
        '(`/machines/{id}/history` is the record’s change log.)',
      access: 'history',
      params: IdParamSchema,
      answer: {
        status: 200,
        description: 'The machine’s history.',
        schema: MachineHistorySchema,
        example: MACHINE_JOB_HISTORY_EXAMPLE,
      },
      problems: { 404: 'No machine with this id in your organisation.' },
      handle: ({ params, res }) => history.history(actorOf(res), params.id),
    })
    .add({
      method: 'get',
      path: JOBS_EXPORT_PATH,
      summary: 'The shop’s jobs of a date range, as a CSV file',
      description:
        'One row per job scheduled, or completed, from `from` to `to` (both included; at most three years), ' +
        'by date then number: UTF-8 with a byte order mark, CRLF line ends, fields quoted where needed, ' +
        'and text a spreadsheet would run as a formula (beginning with =, +, -, @, a tab or a carriage ' +
        'return) prefixed with an apostrophe; numbers are left as numbers. The columns: ' +
        'docs/machine-history.md.',
      access: 'export',
      query: JobsExportQuerySchema,
      answer: {
        status: 200,
        description: 'The CSV file, as an attachment named after the range.',
        headers: {
          'Content-Disposition': {
            description: 'attachment; filename="counterpoise-jobs-<from>-to-<to>.csv"',
            schema: { type: 'string' },
          },
        },
        content: {
          'text/csv': { schema: { type: 'string', format: 'binary' }, example: JOBS_CSV_EXAMPLE },
        },
      },
      handle: ({ query, res }) => {
        const text = history.exportJobs(actorOf(res), query);
        res
          .status(200)
          .type('text/csv; charset=utf-8')
          .attachment(MachineHistoryService.exportFileName(query))
          .send(Buffer.from(text, 'utf8'));
        return undefined;
      },
    });
}
