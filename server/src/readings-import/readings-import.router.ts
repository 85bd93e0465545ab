import type { ResponseConfig } from '@asteasolutions/zod-to-openapi';
import {
  type Job,
  JobChangedMeanwhileSchema,
  JobSchema,
  PROBLEM_MEDIA_TYPE,
  READINGS_CSV_MAX_BYTES,
  READINGS_CSV_MEDIA_TYPE,
  ReadingsImportPreviewSchema,
} from '@counterpoise/api';
import express, { type RequestHandler, type Response } from 'express';
import { IdParamSchema } from '../http/params';
import { HttpProblem } from '../http/problem';
import { type AccessRule, type FeatureRoutes, type RawBody, RouteTable } from '../http/route';
import { JOB_EXAMPLE } from '../jobs/jobs.examples';
import { ETAG_HEADER, IF_MATCH_HEADERS, PROBLEMS as JOB_PROBLEMS } from '../jobs/jobs.router';
import type { JobActor } from '../jobs/jobs.service';
import { RECORDS_BASE_PATH } from '../records/record-routes';
import { etagOf, ifMatchVersions, requireIfMatch } from '../records/versions';
import { PREVIEW_EXAMPLE, SAMPLE_CSV_EXAMPLE } from './readings-import.examples';
import type { ReadingsImportService } from './readings-import.service';

/** Who may import readings: the people who may add a run to the job (`jobs:write`, own jobs, or `-any`). */
export type ReadingsImportAccess = 'write';

const KB = Math.round(READINGS_CSV_MAX_BYTES / 1024);

const CHARSET = /;\s*charset\s*=\s*"?([^";\s]*)"?/i;

/**
 * 415 unless the body is declared `text/csv` (or `text/plain`, what some systems call a CSV file), in UTF-8
 * when a charset is named: the file is read as UTF-8 and nothing else.
 */
const requireCsv: RequestHandler = (req, _res, next) => {
  const sent = req.headers['content-type'];
  const charset = CHARSET.exec(sent ?? '')?.[1]?.toLowerCase();
  if (!req.is(['text/csv', 'text/plain']) || (charset !== undefined && charset !== 'utf-8')) {
    next(
      new HttpProblem(
        415,
        'Unsupported Media Type',
        `Send the readings file as it is, with Content-Type: text/csv (UTF-8); got ${sent ?? 'no Content-Type'}.`,
      ),
    );
    return;
  }
  next();
};

const readBytes = express.raw({ type: () => true, limit: READINGS_CSV_MAX_BYTES });

/** The file's bytes, at most READINGS_CSV_MAX_BYTES; a larger file is a 413 that says the limit. */
const readFile: RequestHandler = (req, res, next) => {
  readBytes(req, res, (error?: unknown) => {
    if ((error as { type?: unknown } | undefined)?.type === 'entity.too.large') {
      const message = `The file is larger than ${KB} kB: import it in parts.`;
      next(new HttpProblem(413, 'Content Too Large', message, [{ path: 'file', message }]));
      return;
    }
    next(error);
  });
};

const CSV_BODY: RawBody = {
  parse: [requireCsv, readFile],
  content: {
    [READINGS_CSV_MEDIA_TYPE]: {
      schema: { type: 'string', example: SAMPLE_CSV_EXAMPLE },
    },
  },
  description: `The readings file (docs/readings-csv.md), at most ${KB} kB, UTF-8.`,
};

const PROBLEMS = {
  403: JOB_PROBLEMS[403],
  404: JOB_PROBLEMS[404],
  409: 'The job’s state does not take runs (`JOB_NOT_OPEN`), or a step before the runs is missing (`STEP_MISSING`).',
  413: `The file is larger than ${KB} kB.`,
  415: 'The body is not declared `text/csv` (or `text/plain`) in UTF-8.',
};

function actorOf(res: Response): JobActor {
  const user = res.locals.user;
  if (user === undefined) throw new Error('The readings import runs behind requireUser.');
  return user;
}

/** Whatever body parser ran, the bytes it left (none when the body was empty). */
function bytesOf(body: unknown): Uint8Array {
  return body instanceof Uint8Array ? body : new Uint8Array();
}

/** The two routes of a readings import under `/api/v1/jobs/{id}/runs/import`; access comes from the app. */
export function readingsImportRouter(deps: {
  access: Readonly<Record<ReadingsImportAccess, AccessRule>>;
  imports: ReadingsImportService;
}): FeatureRoutes {
  const { imports } = deps;
  const table = new RouteTable({ basePath: RECORDS_BASE_PATH, tag: 'Jobs', access: deps.access });
  table
    .add({
      method: 'post',
      path: '/jobs/{id}/runs/import/preview',
      summary: 'Preview the runs a readings file would add',
      description:
        'Reads the file (our own CSV format: docs/readings-csv.md) and judges it against the job as it stands ' +
        '(its set-up’s sensors and unit, the machine’s planes, the runs already stored), exactly as runs typed ' +
        'in are judged. Answers the runs it would add, each sensor’s repeats averaged as the server stores them ' +
        'with their warnings, and every bad row by its line in the file, column, value and what is wrong ' +
        '(`errors`; a file that cannot be read at all, such as an empty or binary one, is an error of `file`). ' +
        'Nothing is saved. Import it with `If-Match: "<jobVersion>"`.',
      access: 'write',
      params: IdParamSchema,
      rawBody: CSV_BODY,
      answer: {
        status: 200,
        description: 'What the import would add, and every bad row; nothing saved.',
        schema: ReadingsImportPreviewSchema,
        example: PREVIEW_EXAMPLE,
      },
      problems: PROBLEMS,
      handle: ({ params, req, res }) => imports.preview(actorOf(res), params.id, bytesOf(req.body)),
    })
    .add({
      method: 'post',
      path: '/jobs/{id}/runs/import',
      summary: 'Import the runs of a readings file',
      description:
        'Adds every run of the file in one transaction, or none: a file with any bad row is a 400 whose ' +
        '`errors` name each row and column (`rows[12].phaseDeg`, with `row`, `column` and `value`; `code` ' +
        '`READINGS_FILE_REFUSED`), as the preview lists them. Send the version the preview was made on in ' +
        '`If-Match`: when the job changed since, 412 with the job as stored in `current`, and nothing is written ' +
        '(428 without it).',
      access: 'write',
      params: IdParamSchema,
      headers: IF_MATCH_HEADERS,
      before: [requireIfMatch],
      rawBody: CSV_BODY,
      answer: {
        status: 201,
        description: 'The job with the runs added.',
        schema: JobSchema,
        example: JOB_EXAMPLE,
        headers: ETAG_HEADER,
      },
      problems: {
        ...PROBLEMS,
        412: {
          description:
            'The job changed since the version in `If-Match` (`CHANGED_MEANWHILE`); `current` holds it as stored.',
          headers: ETAG_HEADER,
          content: { [PROBLEM_MEDIA_TYPE]: { schema: JobChangedMeanwhileSchema } },
        } satisfies ResponseConfig,
        428: 'No `If-Match` header, or `If-Match: *` (`code` `VERSION_REQUIRED`).',
      },
      handle: ({ params, req, res }) => {
        const job: Job = imports.import(
          actorOf(res),
          params.id,
          ifMatchVersions(res.locals),
          bytesOf(req.body),
        );
        res.setHeader('ETag', etagOf(job.version));
        return job;
      },
    });
  return table;
}
