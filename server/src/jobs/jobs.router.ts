import type { ResponseConfig } from '@asteasolutions/zod-to-openapi';
import {
  AbandonJobSchema,
  AcknowledgeSafetySchema,
  AddRunSchema,
  AssignJobSchema,
  ComputeCorrectionSchema,
  CorrectRunReadingsSchema,
  CreateJobSchema,
  type Job,
  JobChangedMeanwhileSchema,
  JobListQuerySchema,
  JobPageSchema,
  JobSchema,
  JobsHomeSchema,
  OverrideInspectionSchema,
  PROBLEM_MEDIA_TYPE,
  RecordInspectionSchema,
  RecordInstalledSchema,
  RecordSetupSchema,
} from '@counterpoise/api';
import type { Response } from 'express';
import * as z from 'zod';
import { IdParamSchema } from '../http/params';
import { type AccessRule, type FeatureRoutes, RouteTable } from '../http/route';
import { RECORDS_BASE_PATH } from '../records/record-routes';
import { etagOf, ifMatchVersions, requireIfMatch } from '../records/versions';
import {
  ADD_RUN_EXAMPLE,
  CORRECT_RUN_READINGS_EXAMPLE,
  CREATE_JOB_EXAMPLE,
  INSPECTION_EXAMPLE,
  INSTALLED_EXAMPLE,
  JOB_EXAMPLE,
  JOB_PAGE_EXAMPLE,
  JOBS_HOME_EXAMPLE,
  SETUP_EXAMPLE,
} from './jobs.examples';
import type { JobActor, JobsService } from './jobs.service';

/**
 * Who may call a job route: read (`jobs:read`), write (`jobs:write`: the caller's own jobs, any job for
 * those who also hold `jobs:write-any`), manage (`jobs:write-any`: assign, reopen, override).
 */
export type JobAccess = 'read' | 'write' | 'manage';

/** The `ETag` header of an answer that holds a job; other features' job routes document it too. */
export const ETAG_HEADER: ResponseConfig['headers'] = {
  ETag: {
    description: 'The version of the job, quoted (`"3"`): send it back in `If-Match` to change the job.',
    schema: { type: 'string', example: '"3"' },
  },
};

/** The `If-Match` header of a change of a job. */
export const IF_MATCH_HEADERS = z.object({
  'if-match': z.string().optional().meta({
    description: 'The ETag of the version of the job the change is made on (`"3"`).',
    example: '"3"',
  }),
});

const CorrectionParamSchema = IdParamSchema.extend({
  correctionId: z
    .string()
    .regex(/^[1-9]\d{0,15}$/, { error: 'The correction id is a positive whole number.' })
    .transform(Number)
    .meta({ param: { name: 'correctionId', in: 'path' }, example: '12' }),
});

const RunParamSchema = IdParamSchema.extend({
  runId: z
    .string()
    .regex(/^[1-9]\d{0,15}$/, { error: 'The run id is a positive whole number.' })
    .transform(Number)
    .meta({ param: { name: 'runId', in: 'path' }, example: '402' }),
});

const IF_MATCH_RULE =
  'Send the job’s ETag in `If-Match`: without it 428; when the job changed since (another step, a run added ' +
  'from another tab), 412 with the job as stored in `current`, and nothing is written.';

/** The problems a change of a job may answer, by status. */
export const PROBLEMS = {
  403: 'The job is another technician’s and the caller may change only their own (`code` `NOT_YOUR_JOB`), or the role lacks the permission.',
  404: 'No job with this id in your organisation (another organisation’s jobs are not found either).',
  409: 'The job’s state does not allow the step (`JOB_NOT_OPEN`), a step before it is missing (`STEP_MISSING`), or the stored runs do not allow the method (`METHOD_NOT_POSSIBLE`, or the engine’s code).',
  412: {
    description:
      'The job changed since the version in `If-Match` (`CHANGED_MEANWHILE`); `current` holds it as stored.',
    headers: ETAG_HEADER,
    content: { [PROBLEM_MEDIA_TYPE]: { schema: JobChangedMeanwhileSchema } },
  } satisfies ResponseConfig,
  428: 'No `If-Match` header, or `If-Match: *` (`code` `VERSION_REQUIRED`).',
};

/** The signed-in person of a request that passed the guard. */
function actorOf(res: Response): JobActor {
  const user = res.locals.user;
  if (user === undefined) throw new Error('The jobs routes run behind requireUser.');
  return user;
}

function withEtag(res: Response, job: Job): Job {
  res.setHeader('ETag', etagOf(job.version));
  return job;
}

/** The job routes under `/api/v1/jobs`, on the signed-in router; access comes from the app. */
export function jobsRouter(deps: {
  access: Readonly<Record<JobAccess, AccessRule>>;
  jobs: JobsService;
}): FeatureRoutes {
  const { jobs } = deps;
  const table = new RouteTable({ basePath: RECORDS_BASE_PATH, tag: 'Jobs', access: deps.access });
  const answer = (description: string, status: 200 | 201 = 200) => ({
    status,
    description,
    schema: JobSchema,
    example: JOB_EXAMPLE,
    headers: ETAG_HEADER,
  });
  const versions = (res: Response) => ifMatchVersions(res.locals);

  table
    .add({
      method: 'get',
      path: '/jobs',
      summary: 'List the organisation’s jobs',
      description:
        'Filters by `status`, `technicianId`, `customerId`, `machineId` and scheduled date (`from`, `to`, ' +
        'inclusive); newest date first, ties by id; `total` counts every match.',
      access: 'read',
      query: JobListQuerySchema,
      answer: {
        status: 200,
        description: 'One page of jobs.',
        schema: JobPageSchema,
        example: JOB_PAGE_EXAMPLE,
      },
      handle: ({ query, res }) => jobs.list(actorOf(res), query),
    })
    .add({
      method: 'get',
      path: '/jobs/home',
      summary: 'The caller’s day',
      description:
        'The caller’s open and on-hold jobs; the jobs on hold for a manager (all of them for a manager, the ' +
        'caller’s for a technician); machines whose last job is old, abandoned or ended above the acceptance level.',
      access: 'read',
      answer: {
        status: 200,
        description: 'The summary.',
        schema: JobsHomeSchema,
        example: JOBS_HOME_EXAMPLE,
      },
      handle: ({ res }) => jobs.home(actorOf(res)),
    })
    .add({
      method: 'post',
      path: '/jobs',
      summary: 'Start a job',
      description:
        'A job on a machine in use, for a date; the caller’s own unless a manager names the technician ' +
        '(400 on `machineId` or `technicianId`, `code` `UNKNOWN_REFERENCE`).',
      access: 'write',
      body: CreateJobSchema,
      bodyExample: CREATE_JOB_EXAMPLE,
      answer: {
        ...answer('The job as stored, at version 1.', 201),
        headers: {
          ...ETAG_HEADER,
          Location: { description: 'Where the job is: `/api/v1/jobs/{id}`.', schema: { type: 'string' } },
        },
      },
      problems: { 403: PROBLEMS[403] },
      handle: ({ body, res }) => {
        const job = jobs.create(actorOf(res), body);
        res.setHeader('Location', `${RECORDS_BASE_PATH}/jobs/${job.id}`);
        return withEtag(res, job);
      },
    })
    .add({
      method: 'get',
      path: '/jobs/{id}',
      summary: 'One job, with everything it holds',
      description:
        'Its steps, runs (each sensor’s repeats and their vector average), corrections (the calculator request ' +
        'and answer, the plan, what was installed and the predicted reading), the verdict of its latest run ' +
        'against the acceptance level, and `nextStep`, where the stepper opens.',
      access: 'read',
      params: IdParamSchema,
      answer: answer('The job.'),
      problems: { 404: PROBLEMS[404] },
      handle: ({ params, res }) => withEtag(res, jobs.get(actorOf(res), params.id)),
    });

  const step = <B extends z.ZodType>(options: {
    method: 'post' | 'put';
    path: string;
    summary: string;
    description: string;
    access: JobAccess;
    body?: B;
    bodyExample?: z.input<B>;
    status?: 200 | 201;
    handle: (actor: JobActor, id: number, versions: readonly number[], body: z.output<B>) => Job;
  }) =>
    table.add({
      method: options.method,
      path: options.path,
      summary: options.summary,
      description: `${options.description} ${IF_MATCH_RULE}`,
      access: options.access,
      params: IdParamSchema,
      headers: IF_MATCH_HEADERS,
      before: [requireIfMatch],
      ...(options.body === undefined
        ? {}
        : { body: options.body as z.ZodType, bodyExample: options.bodyExample as never, bodyLimit: '64kb' }),
      answer: answer('The job as changed.', options.status ?? 200),
      problems: PROBLEMS,
      handle: ({ params, body, res }) =>
        withEtag(res, options.handle(actorOf(res), params.id, versions(res), body as z.output<B>)),
    });

  step({
    method: 'post',
    path: '/jobs/{id}/assign',
    summary: 'Give a job to a technician',
    description: 'To an active person of the organisation whose role does jobs (400 on `technicianId`).',
    access: 'manage',
    body: AssignJobSchema,
    bodyExample: { technicianId: 7 },
    handle: (actor, id, v, body) => jobs.assign(actor, id, v, body.technicianId),
  });
  step({
    method: 'post',
    path: '/jobs/{id}/abandon',
    summary: 'Abandon a job, with the reason',
    description: 'An open or on-hold job; the reason is kept. A manager may reopen it.',
    access: 'write',
    body: AbandonJobSchema,
    bodyExample: { reason: 'The customer sold the machine before the visit.' },
    handle: (actor, id, v, body) => jobs.abandon(actor, id, v, body.reason),
  });
  step({
    method: 'post',
    path: '/jobs/{id}/reopen',
    summary: 'Reopen an abandoned job',
    description:
      'Back to open (on hold if its inspection failed without an override); the abandonment is kept.',
    access: 'manage',
    handle: (actor, id, v) => jobs.reopen(actor, id, v),
  });
  step({
    method: 'put',
    path: '/jobs/{id}/safety',
    summary: 'Acknowledge the safety cautions',
    description: 'Every topic’s id (`JOB_SAFETY_TOPICS`); the server keeps the time and who acknowledged.',
    access: 'write',
    body: AcknowledgeSafetySchema,
    bodyExample: { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] },
    handle: (actor, id, v, body) => jobs.acknowledgeSafety(actor, id, v, body.topicIds),
  });
  step({
    method: 'put',
    path: '/jobs/{id}/inspection',
    summary: 'Record the pre-balance inspection',
    description:
      'Judged on the server against the family’s limits (common-practice defaults without a family): a ' +
      'limit over, or a check left at `fault`, puts the job on hold until a re-measure within the limits ' +
      'or a manager’s override. Needs the safety acknowledgement.',
    access: 'write',
    body: RecordInspectionSchema,
    bodyExample: INSPECTION_EXAMPLE,
    handle: (actor, id, v, body) => jobs.recordInspection(actor, id, v, body),
  });
  step({
    method: 'post',
    path: '/jobs/{id}/inspection/override',
    summary: 'Let a job on hold go on, with the reason',
    description: 'A manager’s decision on a failed inspection; the reason is kept with the inspection.',
    access: 'manage',
    body: OverrideInspectionSchema,
    bodyExample: {
      reason: 'End play checked with the customer: bearings ordered, balance now to finish the season.',
    },
    handle: (actor, id, v, body) => jobs.overrideInspection(actor, id, v, body.reason),
  });
  step({
    method: 'put',
    path: '/jobs/{id}/setup',
    summary: 'Record the set-up of the instrument',
    description:
      'Sensors, tachometer, reference mark, rotation, speed, unit and phase counting; fixed once a run is read.',
    access: 'write',
    body: RecordSetupSchema,
    bodyExample: SETUP_EXAMPLE,
    handle: (actor, id, v, body) => jobs.recordSetup(actor, id, v, body),
  });
  step({
    method: 'post',
    path: '/jobs/{id}/runs',
    summary: 'Add a run with its readings',
    description:
      'The first run is the initial one; a trial run names its trial weight; a verification run follows ' +
      'installed weights. The server averages each sensor’s repeats as vectors, and warns when they disagree ' +
      'or the speed drifted from the initial run’s (2 %, a product default). When the phase cannot be read, ' +
      'leave `phaseDeg` out of every repeat: the run is amplitude only (`amplitudeOnly` in the answer), its ' +
      'repeats average as a plain mean of the amplitudes with their spread, and only the `four-run` method ' +
      'uses it. A run is read with phase throughout or without it throughout: a repeat without phase among ' +
      'repeats with it is a 400 on that repeat’s `phaseDeg`. Example of an amplitude-only trial run: ' +
      '`{"kind":"trial","trialWeight":{"planeIndex":0,"massGrams":40,"angleDeg":120},"readings":' +
      '[{"sensorSide":"left","repeats":[{"amplitude":0.31,"speedRpm":1480},{"amplitude":0.32,"speedRpm":1481}]}]}`.',
    access: 'write',
    body: AddRunSchema,
    bodyExample: ADD_RUN_EXAMPLE,
    status: 201,
    handle: (actor, id, v, body) => jobs.addRun(actor, id, v, body),
  });
  table.add({
    method: 'put',
    path: '/jobs/{id}/runs/{runId}/readings',
    summary: 'Type the readings of the latest run again',
    description:
      'When a run’s readings were mistyped (a phase of 212 typed as 21, the other sensor’s amplitude): every ' +
      'sensor’s repeats as in AddRun replace the run’s, and a trial run’s `trialWeight` may be typed again ' +
      'too (left out, the stored one stays; a run of another kind has none). The kind does not change. The ' +
      'server averages and checks them again as when the run was added (spread, speed drift from the ' +
      'initial run) and appends what was typed before, with who and when, to the run’s `retyped`: the first ' +
      'entry holds the run as first typed. An open job’s latest run only, and only while no correction was ' +
      `computed from it: otherwise 409 \`RUN_IN_USE\`, and a new run is the way to read again. ${IF_MATCH_RULE}`,
    access: 'write',
    params: RunParamSchema,
    headers: IF_MATCH_HEADERS,
    before: [requireIfMatch],
    body: CorrectRunReadingsSchema,
    bodyExample: CORRECT_RUN_READINGS_EXAMPLE,
    bodyLimit: '64kb',
    answer: answer('The job as changed, the run with its new readings and `retyped`.'),
    problems: {
      ...PROBLEMS,
      404: 'No job with this id in your organisation, or the job has no run with this id.',
      409:
        'The run is not the job’s latest, or a correction was computed from it (`RUN_IN_USE`: take a new run ' +
        'instead); the job is not open (`JOB_NOT_OPEN`); a step before it is missing (`STEP_MISSING`).',
    },
    handle: ({ params, body, res }) =>
      withEtag(res, jobs.correctRunReadings(actorOf(res), params.id, params.runId, versions(res), body)),
  });
  step({
    method: 'post',
    path: '/jobs/{id}/corrections',
    summary: 'Compute a correction from the stored runs',
    description:
      'The server computes it with the calculator’s routes from the stored readings (never from numbers ' +
      'the client sends): `one-run` with the family’s stored sensitivity, `single-plane` from a trial run ' +
      '(or, after a verified correction, as a trim run), `multi-plane` from every trial and verification ' +
      'run (least squares with more runs than planes), `four-run` (amplitude only) from the initial run and ' +
      'the same trial weight at three positions, all read without phase. A method the stored runs do not ' +
      'allow (a trial run missing, a run read without phase for a method that needs it) is a 409 ' +
      'METHOD_NOT_POSSIBLE saying which runs are missing.',
    access: 'write',
    body: ComputeCorrectionSchema,
    bodyExample: { method: 'single-plane' },
    status: 201,
    handle: (actor, id, v, body) => jobs.computeCorrection(actor, id, v, body.method),
  });
  table.add({
    method: 'put',
    path: '/jobs/{id}/corrections/{correctionId}/installed',
    summary: 'Record what was really installed for a correction',
    description:
      'Mass, angle, plane, radius and fixing of each weight; the server predicts the reading they leave. ' +
      `The latest correction only, until a run is taken after it. ${IF_MATCH_RULE}`,
    access: 'write',
    params: CorrectionParamSchema,
    headers: IF_MATCH_HEADERS,
    before: [requireIfMatch],
    body: RecordInstalledSchema,
    bodyExample: INSTALLED_EXAMPLE,
    answer: answer('The job as changed.'),
    problems: PROBLEMS,
    handle: ({ params, body, res }) =>
      withEtag(
        res,
        jobs.recordInstalled(actorOf(res), params.id, params.correctionId, versions(res), body.weights),
      ),
  });
  step({
    method: 'post',
    path: '/jobs/{id}/complete',
    summary: 'Complete the job',
    description:
      'Needs a run after the last weights fitted. Keeps before and after per side, the weights now on the ' +
      'rotor, the coefficients the job measured, and refines the family’s stored sensitivity from every ' +
      'completed job of the family.',
    access: 'write',
    handle: (actor, id, v) => jobs.complete(actor, id, v),
  });
  return table;
}
