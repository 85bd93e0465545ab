import {
  type AddRun,
  can,
  type CorrectRunReadings,
  type CreateJob,
  type InstalledWeight,
  type JobSafetyTopic,
  type Job,
  type JobListQuery,
  type JobPage,
  JOBS_PROBLEM_CODES,
  type JobsHome,
  type JobStatus,
  type JobSummary,
  type RecordInspection,
  type RecordSetup,
  type Role,
  acceptanceOf,
  baseRun,
  checkSensors,
  computeCorrection,
  inspectionLimitsOf,
  installedSoFar,
  JobChangeRefusal,
  judgeInspection,
  measuredCoefficients,
  nextStepOf,
  planeRadiiOf,
  planInstalled,
  planRun,
  refinedSensitivities,
  requireInspected,
  requireSafety,
  requireSetupChangeable,
  requireStatus,
  requireWorking,
  runIsAmplitudeOnly,
  runSpeedRpm,
  averageRun,
  verdictOf,
  verificationOf,
  WORKING_OR_ON_HOLD_STATUSES,
  WORKING_STATUSES,
} from '@counterpoise/api';
import type { Clock } from '../clock';
import { HttpProblem } from '../http/problem';
import type { MachineFamiliesService } from '../machine-families/machine-families.service';
import { checkVersion } from '../records/versions';
import type { StoredCompletion, StoredInspection, StoredSetup } from './job-records';
import type { CorrectionRow, JobChange, JobRow, JobsRepo } from './jobs.repo';

/** Who calls the jobs' service: a signed-in person of an organisation, with their role. */
export interface JobActor {
  readonly id: number;
  readonly organisationId: number;
  readonly role: Role;
}

/** A machine whose last job is older than this many days is due again (a product default). */
export const DUE_AFTER_DAYS = 365;

function conflict(detail: string, code: string = JOBS_PROBLEM_CODES.stepMissing): HttpProblem {
  return new HttpProblem(409, 'Conflict', detail, undefined, 'about:blank', code);
}

function badField(path: string, message: string): HttpProblem {
  return new HttpProblem(
    400,
    'Bad Request',
    `${path}: ${message}`,
    [{ path, message }],
    'about:blank',
    JOBS_PROBLEM_CODES.unknownReference,
  );
}

function notFound(): HttpProblem {
  return new HttpProblem(404, 'Not Found', 'No job with this id in your organisation.');
}

/** What a step may be written in, by the job's status. */
const WORKING = WORKING_STATUSES;
const WORKING_OR_ON_HOLD = WORKING_OR_ON_HOLD_STATUSES;

/**
 * The problem answer of a job's rule refused (`JobChangeRefusal`, from the rules the device shares); any
 * other error as it is. The one place where the jobs' rules become HTTP.
 */
export function asProblem(error: unknown): unknown {
  if (!(error instanceof JobChangeRefusal)) return error;
  return new HttpProblem(error.status, error.title, error.detail, error.errors, 'about:blank', error.code);
}

/**
 * The balancing jobs of an organisation: each step is stored as it is done, every stored correction is
 * recomputed here from the stored readings (never taken from the client), and every change is written
 * on the version the client read, in one transaction, so that parallel writes neither interleave nor
 * double.
 */
export class JobsService {
  constructor(
    private readonly repo: JobsRepo,
    private readonly families: MachineFamiliesService,
    private readonly clock: Clock,
  ) {}

  list(actor: JobActor, query: JobListQuery & { page: number; pageSize: number }): JobPage {
    const { rows, total } = this.repo.list(actor.organisationId, query);
    const names = this.repo.peopleNames(actor.organisationId);
    return {
      items: rows.map((row) => summaryOf(row, names)),
      total,
      page: query.page,
      pageSize: query.pageSize,
    };
  }

  get(actor: JobActor, id: number): Job {
    const row = this.repo.find(actor.organisationId, id);
    if (row === undefined) throw notFound();
    return this.toJob(row);
  }

  create(actor: JobActor, body: CreateJob): Job {
    const technicianId = body.technicianId ?? actor.id;
    if (technicianId !== actor.id && !can(actor.role, 'jobs:write-any')) {
      throw new HttpProblem(
        403,
        'Forbidden',
        'Only a manager gives a job to someone else.',
        [{ path: 'technicianId', message: 'Leave it out: the job is yours.' }],
        'about:blank',
        JOBS_PROBLEM_CODES.notYourJob,
      );
    }
    return this.repo.transaction(() => {
      const machine = this.repo.findMachine(actor.organisationId, body.machineId);
      if (machine === undefined || machine.archivedAt !== null) {
        throw badField(
          'machineId',
          machine === undefined
            ? `There is no machine ${body.machineId} in your organisation.`
            : 'The machine is archived: restore it first.',
        );
      }
      this.checkTechnician(actor, technicianId);
      const id = this.repo.insertJob(
        actor.organisationId,
        { machineId: machine.id, technicianId, scheduledFor: body.scheduledFor, createdById: actor.id },
        this.clock.now(),
      );
      return this.get(actor, id);
    });
  }

  assign(actor: JobActor, id: number, versions: readonly number[], technicianId: number): Job {
    return this.change(actor, id, versions, WORKING_OR_ON_HOLD, () => {
      this.checkTechnician(actor, technicianId);
      return { technicianId };
    });
  }

  abandon(actor: JobActor, id: number, versions: readonly number[], reason: string): Job {
    return this.change(actor, id, versions, WORKING_OR_ON_HOLD, () => ({
      status: 'abandoned',
      abandonment: { reason, at: this.now(), byId: actor.id, reopenedAt: null, reopenedById: null },
    }));
  }

  reopen(actor: JobActor, id: number, versions: readonly number[]): Job {
    return this.change(actor, id, versions, ['abandoned'], (job) => ({
      status:
        job.inspection && !job.inspection.passed && job.inspection.override === null ? 'on-hold' : 'open',
      abandonment: { ...job.abandonment!, reopenedAt: this.now(), reopenedById: actor.id },
    }));
  }

  acknowledgeSafety(
    actor: JobActor,
    id: number,
    versions: readonly number[],
    topicIds: readonly JobSafetyTopic[],
  ): Job {
    return this.change(actor, id, versions, WORKING_OR_ON_HOLD, () => ({
      safety: { topicIds: [...new Set(topicIds)], acknowledgedAt: this.now(), byId: actor.id },
    }));
  }

  /**
   * Judges the measured end play and runout against the family's limits (common practice defaults, in
   * inches converted to mm, for a machine without a family) and the visual checks: a limit over, or a
   * fault left, puts the job on hold until a re-measure within the limits or a manager's override.
   */
  recordInspection(actor: JobActor, id: number, versions: readonly number[], body: RecordInspection): Job {
    return this.change(actor, id, versions, WORKING_OR_ON_HOLD, (job) => {
      requireSafety(job);
      const machine = this.repo.findMachine(actor.organisationId, job.machineId)!;
      const family =
        machine.familyId === null ? undefined : this.repo.findFamily(actor.organisationId, machine.familyId);
      const judged = judgeInspection(body, inspectionLimitsOf(family));
      const inspection: StoredInspection = {
        ...judged.inspection,
        measuredAt: this.now(),
        byId: actor.id,
        override: null,
      };
      return { inspection, status: judged.status };
    });
  }

  overrideInspection(actor: JobActor, id: number, versions: readonly number[], reason: string): Job {
    return this.change(actor, id, versions, ['on-hold'], (job) => ({
      status: 'open',
      inspection: { ...job.inspection!, override: { reason, at: this.now(), byId: actor.id } },
    }));
  }

  recordSetup(actor: JobActor, id: number, versions: readonly number[], body: RecordSetup): Job {
    return this.change(actor, id, versions, WORKING, (job) => {
      requireSetupChangeable(job, this.repo.runsOf(actor.organisationId, job.id).length);
      const setup: StoredSetup = { ...body, recordedAt: this.now() };
      return { setup };
    });
  }

  addRun(actor: JobActor, id: number, versions: readonly number[], body: AddRun): Job {
    return this.change(actor, id, versions, WORKING, (job) => {
      this.insertRun(actor, job, body);
      return {};
    });
  }

  /**
   * Several runs added in one transaction, in order (a file of readings), each checked and averaged exactly
   * as `addRun` does, with one new version for them all. A run the job refuses throws, and nothing is
   * stored; with `refused`, it is handed there with its index and left out instead, so that every run is
   * judged (the caller then decides whether to keep what landed).
   */
  addRuns(
    actor: JobActor,
    id: number,
    versions: readonly number[],
    bodies: readonly AddRun[],
    refused?: (index: number, problem: HttpProblem) => void,
  ): Job {
    return this.change(actor, id, versions, WORKING, (job) => {
      requireInspected(job);
      if (job.setup === null) throw conflict('Record the set-up first.');
      bodies.forEach((body, index) => {
        try {
          this.insertRun(actor, job, body);
        } catch (error) {
          const problem = asProblem(error);
          if (refused === undefined || !(problem instanceof HttpProblem)) throw problem;
          refused(index, problem);
        }
      });
      return {};
    });
  }

  /** Checks a run against the job as stored (sensors, kinds in order, planes, weights), averages and inserts it. */
  private insertRun(actor: JobActor, job: JobRow, body: AddRun): void {
    const machine = this.repo.findMachine(actor.organisationId, job.machineId)!;
    const run = planRun(
      {
        safety: job.safety,
        inspection: job.inspection,
        setup: job.setup,
        planeRadiiMm: planeRadiiOf(machine),
        runs: this.repo.runsOf(actor.organisationId, job.id),
        corrections: this.repo.correctionsOf(actor.organisationId, job.id),
      },
      body,
    );
    this.repo.insertRun({
      organisationId: actor.organisationId,
      jobId: job.id,
      ...run,
      createdById: actor.id,
      createdAt: this.clock.now(),
    });
  }

  /**
   * The readings of the job's latest run typed again (a phase of 212 typed as 21, another sensor's
   * amplitude), and for a trial run its trial weight if given: averaged and checked as when the run was
   * added, with what was typed before kept in the run's `retyped`. Only while nothing rests on the run:
   * a later run or a correction computed from it makes it 409 `RUN_IN_USE` (take a new run instead).
   */
  correctRunReadings(
    actor: JobActor,
    id: number,
    runId: number,
    versions: readonly number[],
    body: CorrectRunReadings,
  ): Job {
    return this.change(actor, id, versions, WORKING, (job) => {
      const { setup, radii, runs, corrections } = this.workingState(job);
      const run = runs.find((candidate) => candidate.id === runId);
      if (run === undefined) throw new HttpProblem(404, 'Not Found', 'The job has no run with this id.');
      if (run !== runs.at(-1)) {
        throw conflict(
          `Run ${run.sequence} is not the job’s latest run: the runs after it were read with it. Take a new run instead.`,
          JOBS_PROBLEM_CODES.runInUse,
        );
      }
      const used = corrections.filter((correction) => correction.runIds.includes(run.id));
      if (used.length > 0) {
        throw conflict(
          `Correction ${used.map((correction) => correction.sequence).join(', ')} was computed from run ${run.sequence}: ` +
            'its readings can no longer change. Take a new run instead.',
          JOBS_PROBLEM_CODES.runInUse,
        );
      }
      if (body.trialWeight !== undefined && run.kind !== 'trial') {
        throw new HttpProblem(400, 'Bad Request', 'trialWeight: Only a trial run has a trial weight.', [
          { path: 'trialWeight', message: 'Only a trial run has a trial weight.' },
        ]);
      }
      checkSensors(setup, body.readings);
      if (body.trialWeight !== undefined && body.trialWeight.planeIndex >= radii.length) {
        throw badField('trialWeight.planeIndex', `The machine has ${radii.length} plane(s).`);
      }
      const initial = run.kind === 'initial' ? undefined : runs.find((other) => other.kind === 'initial');
      const averaged = averageRun(body.readings, initial === undefined ? undefined : runSpeedRpm(initial));
      this.repo.retypeRun(actor.organisationId, run.id, {
        readings: averaged.readings,
        warnings: averaged.warnings,
        trialWeight: body.trialWeight ?? run.trialWeight,
        retyped: [
          ...run.retyped,
          {
            at: this.now(),
            byId: actor.id,
            previousReadings: run.readings.map((reading) => ({
              sensorSide: reading.sensorSide,
              repeats: reading.repeats,
            })),
            previousTrialWeight: run.trialWeight,
          },
        ],
      });
      return {};
    });
  }

  computeCorrection(
    actor: JobActor,
    id: number,
    versions: readonly number[],
    method: CorrectionRow['method'],
  ): Job {
    return this.change(actor, id, versions, WORKING, (job) => {
      const { setup, radii, runs, corrections, family } = this.workingState(job);
      const computed = computeCorrection({
        method,
        setup,
        planeRadiiMm: radii,
        runs,
        corrections,
        familySensitivities: family?.sensitivities ?? [],
      });
      this.repo.insertCorrection({
        organisationId: actor.organisationId,
        jobId: job.id,
        sequence: corrections.length + 1,
        method: computed.method,
        basis: computed.basis,
        runIds: computed.runIds,
        calc: computed.calc,
        result: computed.result,
        plan: computed.plan,
        installed: null,
        predicted: null,
        installedAt: null,
        warnings: computed.warnings,
        createdById: actor.id,
        createdAt: this.clock.now(),
      });
      return {};
    });
  }

  /**
   * What was really fitted for a correction (the latest one, until a run is taken with it on), with the
   * reading the model predicts for it.
   */
  recordInstalled(
    actor: JobActor,
    id: number,
    correctionId: number,
    versions: readonly number[],
    weights: readonly InstalledWeight[],
  ): Job {
    return this.change(actor, id, versions, WORKING, (job) => {
      const { setup, radii, runs, corrections } = this.workingState(job);
      const correction = corrections.find((c) => c.id === correctionId);
      if (correction === undefined)
        throw new HttpProblem(404, 'Not Found', 'The job has no correction with this id.');
      const predicted = planInstalled(
        { safety: job.safety, inspection: job.inspection, setup, planeRadiiMm: radii, runs, corrections },
        correction,
        weights,
      );
      this.repo.setInstalled(actor.organisationId, correction.id, {
        installed: [...weights],
        predicted,
        installedAt: this.clock.now(),
      });
      return {};
    });
  }

  /**
   * Completes the job: before and after per side, the weights now on the rotor (the last completed job's
   * and this one's), the coefficients this job measured, and the family's stored sensitivity refined from
   * every completed job of the family (written to the family, with its change log).
   */
  complete(actor: JobActor, id: number, versions: readonly number[]): Job {
    return this.change(actor, id, versions, WORKING, (job) => {
      const { setup, radii, runs, corrections, family, machine } = this.workingState(job);
      const base = baseRun(runs)!;
      if (base.weightsOnRotor.length !== installedSoFar(corrections, radii).length) {
        throw conflict('Weights were fitted since the last run: take a verification run with them on first.');
      }
      const initial = runs.find((run) => run.kind === 'initial')!;
      const level = acceptanceOf(machine, family);
      const verdict =
        level === null
          ? null
          : verdictOf(
              base,
              level,
              setup,
              { rotorMassKg: machine.rotorMassKg, speedRpm: setup.operatingSpeedRpm, planeRadiiMm: radii },
              corrections,
            );
      const previous = this.repo.completedJobs(actor.organisationId, { machineId: machine.id }).at(-1);
      const coefficients = measuredCoefficients(runs, corrections, setup, radii).map((c) => ({
        sensorSide: c.sensorSide,
        planeIndex: c.planeIndex,
        amplitudePerGram: c.amplitudePerMass,
        phaseDeg: c.phaseDeg,
        unit: setup.amplitudeUnit,
      }));
      let familySensitivities: StoredCompletion['familySensitivities'] = null;
      if (family !== undefined && coefficients.length > 0) {
        const earlier = this.repo
          .completedJobs(actor.organisationId, { familyId: family.id })
          .flatMap((other) => other.completion?.coefficients ?? []);
        familySensitivities = refinedSensitivities(
          family.sensitivities,
          [...earlier, ...coefficients],
          setup.amplitudeUnit,
        );
        this.families.update(actor, family.id, [family.version], { sensitivities: familySensitivities });
      }
      const completion: StoredCompletion = {
        completedAt: this.now(),
        byId: actor.id,
        accepted: verdict?.accepted ?? false,
        beforeAfter: initial.readings.flatMap((reading) => {
          const after = base.readings.find((r) => r.sensorSide === reading.sensorSide);
          return after === undefined
            ? []
            : [{ sensorSide: reading.sensorSide, before: reading.average, after: after.average }];
        }),
        weightsOnRotor: [
          ...(previous?.completion?.weightsOnRotor ?? []),
          ...corrections.flatMap((c) => (c.installed ?? []).map((weight) => ({ ...weight, jobId: job.id }))),
        ],
        coefficients,
        familySensitivities,
      };
      return { status: 'completed', completion };
    });
  }

  /** The caller's day: their open jobs, jobs waiting for a manager, and machines due. */
  home(actor: JobActor): JobsHome {
    const names = this.repo.peopleNames(actor.organisationId);
    const manager = can(actor.role, 'jobs:write-any');
    const mine = this.repo.withStatus(actor.organisationId, ['open', 'on-hold'], actor.id);
    const waiting = this.repo.withStatus(actor.organisationId, ['on-hold'], manager ? undefined : actor.id);
    const today = this.now().slice(0, 10);
    const dueBefore = new Date(Date.parse(`${today}T00:00:00Z`) - DUE_AFTER_DAYS * 86_400_000)
      .toISOString()
      .slice(0, 10);
    const machinesDue = this.repo.lastJobPerMachine(actor.organisationId).flatMap((row) => {
      let reason: string | undefined;
      if (row.status === 'abandoned') reason = `The last job (${row.scheduledFor}) was abandoned.`;
      else if (row.status === 'completed' && row.completion?.accepted === false) {
        reason = `The last job (${row.scheduledFor}) did not end within the acceptance level.`;
      } else if (row.status === 'completed' && row.scheduledFor < dueBefore) {
        reason = `The last job was on ${row.scheduledFor}, more than ${DUE_AFTER_DAYS} days ago.`;
      }
      return reason === undefined
        ? []
        : [
            {
              machine: machineOf(row),
              lastJob: { id: row.id, scheduledFor: row.scheduledFor, status: row.status },
              reason,
            },
          ];
    });
    return {
      myOpenJobs: mine.map((row) => summaryOf(row, names)),
      waitingForManager: waiting.map((row) => summaryOf(row, names)),
      machinesDue,
      dueAfterDays: DUE_AFTER_DAYS,
    };
  }

  /**
   * One change of a job, in one write transaction: the job must be the organisation's (404), on a
   * version the client named (412 with the job as stored), the caller's own unless they may write any
   * (403), and in a state that allows the step (409). `work` may insert runs or corrections; the job's
   * version goes up with them, in the same statement that checks it.
   */
  private change(
    actor: JobActor,
    id: number,
    versions: readonly number[],
    statuses: readonly JobStatus[],
    work: (job: JobRow) => JobChange,
  ): Job {
    try {
      return this.changeInTransaction(actor, id, versions, statuses, work);
    } catch (error) {
      throw asProblem(error);
    }
  }

  private changeInTransaction(
    actor: JobActor,
    id: number,
    versions: readonly number[],
    statuses: readonly JobStatus[],
    work: (job: JobRow) => JobChange,
  ): Job {
    return this.repo.transaction(() => {
      const job = this.repo.find(actor.organisationId, id);
      if (job === undefined) throw notFound();
      if (!versions.includes(job.version)) checkVersion(this.toJob(job), versions, 'job');
      if (job.technicianId !== actor.id && !can(actor.role, 'jobs:write-any')) {
        throw new HttpProblem(
          403,
          'Forbidden',
          'This job is another technician’s: a manager may change it.',
          undefined,
          'about:blank',
          JOBS_PROBLEM_CODES.notYourJob,
        );
      }
      requireStatus(job.status, statuses);
      const change = work(job);
      if (!this.repo.writeAtVersion(actor.organisationId, id, job.version, change, this.clock.now())) {
        throw new Error('The job changed inside its own write transaction.');
      }
      return this.get(actor, id);
    });
  }

  /** What the correction steps read: set-up, planes, runs, corrections, machine and family. */
  private workingState(job: JobRow) {
    const machine = this.repo.findMachine(job.organisationId, job.machineId)!;
    const family =
      machine.familyId === null ? undefined : this.repo.findFamily(job.organisationId, machine.familyId);
    const radii = planeRadiiOf(machine);
    const runs = this.repo.runsOf(job.organisationId, job.id);
    const { setup } = requireWorking({ ...job, planeRadiiMm: radii, runs, corrections: [] });
    return {
      setup,
      machine,
      family,
      radii,
      runs,
      corrections: this.repo.correctionsOf(job.organisationId, job.id),
    };
  }

  /** The technician of a job: an active person of the organisation whose role does jobs. */
  private checkTechnician(actor: JobActor, technicianId: number): void {
    const person = this.repo.findPerson(actor.organisationId, technicianId);
    if (person === undefined || person.status !== 'active' || !can(person.role, 'jobs:write')) {
      throw badField(
        'technicianId',
        person === undefined
          ? `There is no person ${technicianId} in your organisation.`
          : `${person.name} cannot do jobs (inactive, or a role without jobs).`,
      );
    }
  }

  private now(): string {
    return this.clock.now().toISOString();
  }

  /** The job as the API shows it: its steps, runs, corrections, and the verdict of its latest run. */
  private toJob(row: JobRow): Job {
    const names = this.repo.peopleNames(row.organisationId);
    const person = (id: number) => ({ id, name: names.get(id) ?? 'Unknown person' });
    const runs = this.repo.runsOf(row.organisationId, row.id);
    const corrections = this.repo.correctionsOf(row.organisationId, row.id);
    const machine = this.repo.findMachine(row.organisationId, row.machineId)!;
    const family =
      machine.familyId === null ? undefined : this.repo.findFamily(row.organisationId, machine.familyId);
    const facts = { setup: row.setup, planeRadiiMm: planeRadiiOf(machine), runs, corrections };
    const verification = verificationOf(facts, machine, family);
    return {
      id: row.id,
      version: row.version,
      status: row.status,
      nextStep: nextStepOf(row, facts, verification?.accepted ?? false),
      scheduledFor: row.scheduledFor,
      machine: machineOf(row),
      technician: person(row.technicianId),
      createdAt: row.createdAt.toISOString(),
      updatedAt: row.updatedAt.toISOString(),
      safety: row.safety && {
        topicIds: row.safety.topicIds,
        acknowledgedAt: row.safety.acknowledgedAt,
        by: person(row.safety.byId),
      },
      inspection: row.inspection && {
        ...withoutBy(row.inspection),
        override: row.inspection.override && {
          reason: row.inspection.override.reason,
          at: row.inspection.override.at,
          by: person(row.inspection.override.byId),
        },
        by: person(row.inspection.byId),
      },
      setup: row.setup,
      runs: runs.map((run) => ({
        id: run.id,
        sequence: run.sequence,
        kind: run.kind,
        amplitudeOnly: runIsAmplitudeOnly(run),
        trialWeight: run.trialWeight,
        weightsOnRotor: run.weightsOnRotor,
        readings: run.readings,
        warnings: run.warnings,
        createdAt: run.createdAt.toISOString(),
        by: person(run.createdById),
        retyped: run.retyped.map((retype) => ({ ...withoutBy(retype), by: person(retype.byId) })),
      })),
      corrections: corrections.map((correction) => ({
        id: correction.id,
        sequence: correction.sequence,
        method: correction.method,
        basis: correction.basis,
        runIds: correction.runIds,
        calc: correction.calc,
        result: correction.result,
        plan: correction.plan,
        installed: correction.installed,
        predicted: correction.predicted,
        installedAt: correction.installedAt?.toISOString() ?? null,
        warnings: correction.warnings,
        createdAt: correction.createdAt.toISOString(),
        by: person(correction.createdById),
      })),
      verification,
      completion: row.completion && { ...withoutBy(row.completion), by: person(row.completion.byId) },
      abandonment: row.abandonment && {
        reason: row.abandonment.reason,
        at: row.abandonment.at,
        by: person(row.abandonment.byId),
        reopenedAt: row.abandonment.reopenedAt,
        reopenedBy: row.abandonment.reopenedById === null ? null : person(row.abandonment.reopenedById),
      },
    };
  }
}

function withoutBy<T extends { byId: number }>(value: T): Omit<T, 'byId'> {
  const { byId: _byId, ...rest } = value;
  return rest;
}

function machineOf(row: JobRow): Job['machine'] {
  return {
    id: row.machineId,
    serialNumber: row.serialNumber,
    make: row.make,
    model: row.model,
    customerId: row.customerId,
    customerName: row.customerName,
    familyId: row.familyId,
    familyName: row.familyName,
  };
}

function summaryOf(row: JobRow, names: ReadonlyMap<number, string>): JobSummary {
  return {
    id: row.id,
    version: row.version,
    status: row.status,
    scheduledFor: row.scheduledFor,
    machine: machineOf(row),
    technician: { id: row.technicianId, name: names.get(row.technicianId) ?? 'Unknown person' },
    updatedAt: row.updatedAt.toISOString(),
  };
}
