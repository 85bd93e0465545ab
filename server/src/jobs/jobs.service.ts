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
} from '@counterpoise/api';
import { COMMON_PRACTICE_INSPECTION_LIMITS_IN, evaluateInspection } from '@counterpoise/engine';
import type { Clock } from '../clock';
import { HttpProblem } from '../http/problem';
import type { MachineFamiliesService } from '../machine-families/machine-families.service';
import { checkVersion } from '../records/versions';
import {
  averageRun,
  baseRun,
  computeCorrection,
  runIsAmplitudeOnly,
  installedSoFar,
  measuredCoefficients,
  predictInstalled,
  refinedSensitivities,
  runSpeedRpm,
  verdictOf,
} from './job-calculations';
import type { StoredCompletion, StoredInspection, StoredSetup } from './job-records';
import type { CorrectionRow, JobChange, JobRow, JobsRepo, RunRow } from './jobs.repo';

/** Who calls the jobs' service: a signed-in person of an organisation, with their role. */
export interface JobActor {
  readonly id: number;
  readonly organisationId: number;
  readonly role: Role;
}

/** A machine whose last job is older than this many days is due again (a product default). */
export const DUE_AFTER_DAYS = 365;

const MM_PER_IN = 25.4;

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
const WORKING: readonly JobStatus[] = ['open'];
const WORKING_OR_ON_HOLD: readonly JobStatus[] = ['open', 'on-hold'];

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
      if (job.safety === null) throw conflict('Acknowledge the safety cautions first.');
      const machine = this.repo.findMachine(actor.organisationId, job.machineId)!;
      const family =
        machine.familyId === null ? undefined : this.repo.findFamily(actor.organisationId, machine.familyId);
      const limits = family?.inspectionLimits ?? {
        bearingEndPlayMm: COMMON_PRACTICE_INSPECTION_LIMITS_IN.bearingEndPlay * MM_PER_IN,
        shaftRunoutMm: COMMON_PRACTICE_INSPECTION_LIMITS_IN.stubShaftRunout * MM_PER_IN,
      };
      const judged = evaluateInspection({
        items: [
          {
            name: 'Bearing end play',
            measured: body.bearingEndPlayMm,
            limit: limits.bearingEndPlayMm,
            unit: 'mm',
          },
          { name: 'Shaft runout', measured: body.shaftRunoutMm, limit: limits.shaftRunoutMm, unit: 'mm' },
        ],
      });
      const checkNames = {
        teethOrKnives: 'Teeth or knives',
        buildUpCleaned: 'Build-up',
        welds: 'Welds',
        beltsAndPulleys: 'Belts and pulleys',
      } as const;
      const faults = (Object.keys(checkNames) as (keyof typeof checkNames)[])
        .filter((key) => body.checks[key] === 'fault')
        .map((key) => `${checkNames[key]}: a fault is left; fix it before balancing.`);
      const passed = judged.pass && faults.length === 0;
      const inspection: StoredInspection = {
        bearingEndPlayMm: body.bearingEndPlayMm,
        shaftRunoutMm: body.shaftRunoutMm,
        checks: body.checks,
        notes: body.notes === undefined || body.notes === '' ? null : body.notes,
        limits,
        passed,
        reasons: [...judged.reasons, ...faults],
        measuredAt: this.now(),
        byId: actor.id,
        override: null,
      };
      return { inspection, status: passed ? 'open' : 'on-hold' };
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
      this.requireInspected(job);
      if (this.repo.runsOf(actor.organisationId, job.id).length > 0) {
        throw conflict(
          'The runs are read with this set-up: it can no longer change. Start a new job for another set-up.',
        );
      }
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
      this.requireInspected(job);
      if (job.setup === null) throw conflict('Record the set-up first.');
      bodies.forEach((body, index) => {
        try {
          this.insertRun(actor, job, body);
        } catch (error) {
          if (refused === undefined || !(error instanceof HttpProblem)) throw error;
          refused(index, error);
        }
      });
      return {};
    });
  }

  /** Checks a run against the job as stored (sensors, kinds in order, planes, weights), averages and inserts it. */
  private insertRun(actor: JobActor, job: JobRow, body: AddRun): void {
    this.requireInspected(job);
    const setup = job.setup;
    if (setup === null) throw conflict('Record the set-up first.');
    const machine = this.repo.findMachine(actor.organisationId, job.machineId)!;
    const radii = machine.planes.map((plane) => plane.correctionRadiusMm);
    const runs = this.repo.runsOf(actor.organisationId, job.id);
    const corrections = this.repo.correctionsOf(actor.organisationId, job.id);
    this.checkSensors(setup, body.readings);
    const initial = runs.find((run) => run.kind === 'initial');
    if (body.kind === 'initial' && initial !== undefined)
      throw conflict('The job has its initial run already.');
    if (body.kind !== 'initial' && initial === undefined) throw conflict('Take the initial run first.');
    if (body.trialWeight !== undefined && body.trialWeight.planeIndex >= radii.length) {
      throw badField('trialWeight.planeIndex', `The machine has ${radii.length} plane(s).`);
    }
    const onRotor = installedSoFar(corrections, radii);
    if (body.kind === 'verification' && onRotor.length === 0) {
      throw conflict('Record the weights installed before a verification run.');
    }
    const averaged = averageRun(body.readings, initial === undefined ? undefined : runSpeedRpm(initial));
    this.repo.insertRun({
      organisationId: actor.organisationId,
      jobId: job.id,
      sequence: runs.length + 1,
      kind: body.kind,
      trialWeight: body.trialWeight ?? null,
      weightsOnRotor: onRotor,
      readings: averaged.readings,
      warnings: averaged.warnings,
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
      this.checkSensors(setup, body.readings);
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
      if (correction !== corrections.at(-1))
        throw conflict('Only the latest correction can be fitted.', JOBS_PROBLEM_CODES.jobNotOpen);
      const lastUsed = Math.max(...runIdsSequence(correction, runs));
      if (runs.some((run) => run.sequence > lastUsed)) {
        throw conflict(
          'A run was taken after this correction: what is fitted now is read from that run; compute a new correction.',
          JOBS_PROBLEM_CODES.jobNotOpen,
        );
      }
      weights.forEach((weight, index) => {
        if (weight.planeIndex >= radii.length)
          throw badField(`weights[${index}].planeIndex`, `The machine has ${radii.length} plane(s).`);
      });
      const predicted = predictInstalled(correction, weights, runs, setup, radii);
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
      const level = machine.acceptance ?? family?.acceptance ?? null;
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
      if (!statuses.includes(job.status)) {
        throw conflict(
          `The job is ${job.status}: this step needs it ${statuses.join(' or ')}.`,
          JOBS_PROBLEM_CODES.jobNotOpen,
        );
      }
      const change = work(job);
      if (!this.repo.writeAtVersion(actor.organisationId, id, job.version, change, this.clock.now())) {
        throw new Error('The job changed inside its own write transaction.');
      }
      return this.get(actor, id);
    });
  }

  /** Each sensor of a run's readings is one of the set-up's (400 on the side named otherwise). */
  private checkSensors(setup: StoredSetup, readings: AddRun['readings']): void {
    readings.forEach((reading, index) => {
      if (!setup.sensors.some((sensor) => sensor.side === reading.sensorSide)) {
        throw badField(
          `readings[${index}].sensorSide`,
          `The set-up has no sensor on the ${reading.sensorSide} side.`,
        );
      }
    });
  }

  private requireInspected(job: JobRow): void {
    if (job.safety === null) throw conflict('Acknowledge the safety cautions first.');
    if (job.inspection === null) throw conflict('Record the inspection first.');
  }

  /** What the correction steps read: set-up, planes, runs, corrections, machine and family. */
  private workingState(job: JobRow) {
    this.requireInspected(job);
    if (job.setup === null) throw conflict('Record the set-up first.');
    const machine = this.repo.findMachine(job.organisationId, job.machineId)!;
    const family =
      machine.familyId === null ? undefined : this.repo.findFamily(job.organisationId, machine.familyId);
    const runs = this.repo.runsOf(job.organisationId, job.id);
    if (!runs.some((run) => run.kind === 'initial')) throw conflict('Take the initial run first.');
    return {
      setup: job.setup,
      machine,
      family,
      radii: machine.planes.map((plane) => plane.correctionRadiusMm),
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
    const radii = machine.planes.map((plane) => plane.correctionRadiusMm);
    const base = baseRun(runs);
    const level = machine.acceptance ?? family?.acceptance ?? null;
    const verification =
      base === undefined || level === null || row.setup === null
        ? null
        : verdictOf(
            base,
            level,
            row.setup,
            { rotorMassKg: machine.rotorMassKg, speedRpm: row.setup.operatingSpeedRpm, planeRadiiMm: radii },
            corrections,
          );
    const fitted = installedSoFar(corrections, radii).length;
    return {
      id: row.id,
      version: row.version,
      status: row.status,
      nextStep: nextStepOf(row, runs, corrections, fitted, verification?.accepted ?? false),
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

/** The sequences of the runs a correction used. */
function runIdsSequence(correction: CorrectionRow, runs: readonly RunRow[]): number[] {
  return runs.filter((run) => correction.runIds.includes(run.id)).map((run) => run.sequence);
}

function withoutBy<T extends { byId: number }>(value: T): Omit<T, 'byId'> {
  const { byId: _byId, ...rest } = value;
  return rest;
}

/** The step the stepper opens at. */
function nextStepOf(
  row: JobRow,
  runs: readonly RunRow[],
  corrections: readonly CorrectionRow[],
  fitted: number,
  accepted: boolean,
): Job['nextStep'] {
  if (row.status === 'completed' || row.status === 'abandoned') return 'done';
  if (row.safety === null) return 'safety';
  if (row.inspection === null || row.status === 'on-hold') return 'inspection';
  if (row.setup === null) return 'setup';
  const base = baseRun(runs);
  if (base === undefined) return 'runs';
  if (base.weightsOnRotor.length !== fitted) return 'verification';
  if (accepted) return 'completion';
  return 'correction';
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
