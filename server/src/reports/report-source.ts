import { createHash } from 'node:crypto';
import {
  type AcceptanceLevel,
  type AmplitudeUnit,
  type ContactPerson,
  type InstalledWeight,
  type Job,
  jobNumber,
  type MachineSide,
} from '@counterpoise/api';
import { balanceTolerance } from '@counterpoise/engine';

/*
 * What a service report is built from: the job as the API shows it and the records around it (the shop,
 * the customer, the machine and its family), reduced to what the report prints. Its SHA-256 tells
 * whether a signed revision still matches the job: any change of what the report would print makes a
 * new source.
 */

/** One reading as the report prints it: amplitude in the job's unit, phase (null without), speed. */
export interface ReportReading {
  readonly amplitude: number;
  readonly phaseDeg: number | null;
  readonly speedRpm: number | null;
}

/** Where the acceptance level was set: on the machine itself, or on its family. */
export type AcceptanceSource = 'machine' | 'family';

/** Everything a report prints, as plain data. */
export interface ReportSource {
  readonly jobId: number;
  readonly jobNumber: string;
  readonly jobVersion: number;
  readonly shopName: string;
  readonly customer: {
    readonly name: string;
    readonly siteAddress: string | null;
    readonly email: string | null;
    readonly phone: string | null;
    readonly contacts: readonly ContactPerson[];
  };
  readonly machine: {
    readonly make: string | null;
    readonly model: string | null;
    readonly serialNumber: string | null;
    readonly hours: number | null;
    readonly familyName: string | null;
    readonly rotorMassKg: number | null;
    readonly planeCount: number;
    readonly correctionRadiiMm: readonly number[];
  };
  readonly technician: string;
  readonly scheduledFor: string;
  readonly completedAt: string | null;
  readonly completedBy: string | null;
  readonly safety: { readonly topicIds: readonly string[]; readonly at: string; readonly by: string } | null;
  readonly inspection: {
    readonly bearingEndPlayMm: number;
    readonly shaftRunoutMm: number;
    readonly limits: { readonly bearingEndPlayMm: number; readonly shaftRunoutMm: number };
    readonly checks: Readonly<Record<string, string>>;
    readonly notes: string | null;
    readonly passed: boolean;
    readonly reasons: readonly string[];
    readonly at: string;
    readonly by: string;
    readonly override: { readonly reason: string; readonly at: string; readonly by: string } | null;
  } | null;
  readonly setup: {
    readonly unit: AmplitudeUnit;
    readonly phaseSense: 'lag' | 'lead';
    readonly weightAngles: 'againstRotation' | 'withRotation';
    readonly rotationSeenFromLeft: 'clockwise' | 'counterClockwise';
    readonly operatingSpeedRpm: number;
    readonly sensors: readonly { readonly side: MachineSide; readonly position: string }[];
    readonly tachometer: string;
    readonly referenceMark: string;
  } | null;
  /** Per side: the initial run against the last run. */
  readonly readings: readonly {
    readonly sensorSide: MachineSide;
    readonly before: ReportReading;
    readonly after: ReportReading;
  }[];
  /** Every weight this job fitted, with the correction it belongs to. */
  readonly weights: readonly (InstalledWeight & { readonly correction: number })[];
  /** Weights earlier jobs left on the rotor (as the completion lists them). */
  readonly earlierWeights: readonly InstalledWeight[];
  readonly acceptance: {
    readonly level: AcceptanceLevel;
    readonly source: AcceptanceSource;
    readonly sides: readonly {
      readonly sensorSide: MachineSide;
      readonly amplitude: number;
      readonly limit: number | null;
      readonly accepted: boolean;
    }[];
    readonly accepted: boolean;
    /** For a balance grade with the rotor's mass: ISO 21940-11's permissible residual unbalance. */
    readonly permissible: {
      readonly totalGmm: number;
      readonly perPlaneGmm: readonly number[];
      readonly speedRpm: number;
      readonly rotorMassKg: number;
    } | null;
  } | null;
}

/** The records around a job that the report names. */
export interface ReportRecords {
  readonly shopName: string;
  readonly customer: {
    readonly name: string;
    readonly siteAddress: string | null;
    readonly email: string | null;
    readonly phone: string | null;
    readonly contacts: readonly ContactPerson[];
  };
  readonly machine: {
    readonly hours: number | null;
    readonly rotorMassKg: number | null;
    readonly planes: readonly { readonly correctionRadiusMm: number }[];
    readonly acceptance: AcceptanceLevel | null;
  };
  readonly family: { readonly acceptance: AcceptanceLevel } | null;
}

function readingOf(
  job: Job,
  runId: number | undefined,
  side: MachineSide,
  fallback: { amplitude: number; phaseDeg: number | null },
): ReportReading {
  const run = job.runs.find((candidate) => candidate.id === runId);
  const reading = run?.readings.find((candidate) => candidate.sensorSide === side);
  if (reading === undefined) return { ...fallback, speedRpm: null };
  return {
    amplitude: reading.average.amplitude,
    phaseDeg: reading.average.phaseDeg,
    speedRpm: reading.speedRpm,
  };
}

/** What the report of `job` prints, from the job and its records. */
export function reportSourceOf(job: Job, records: ReportRecords): ReportSource {
  const initialRun = job.runs.find((run) => run.kind === 'initial');
  const lastRunId = job.verification?.runId ?? job.runs.filter((run) => run.kind !== 'trial').at(-1)?.id;
  const readings = (job.completion?.beforeAfter ?? []).map((side) => ({
    sensorSide: side.sensorSide,
    before: readingOf(job, initialRun?.id, side.sensorSide, side.before),
    after: readingOf(job, lastRunId, side.sensorSide, side.after),
  }));
  const weights = job.corrections.flatMap((correction) =>
    (correction.installed ?? []).map((weight) => ({ ...weight, correction: correction.sequence })),
  );
  const earlierWeights = (job.completion?.weightsOnRotor ?? [])
    .filter((weight) => weight.jobId !== job.id)
    .map(({ jobId: _jobId, ...weight }) => weight);
  const level = records.machine.acceptance ?? records.family?.acceptance ?? null;
  const source: AcceptanceSource = records.machine.acceptance === null ? 'family' : 'machine';
  const speedRpm = job.setup?.operatingSpeedRpm ?? null;
  const permissible =
    level?.kind === 'balance-grade' && records.machine.rotorMassKg !== null && speedRpm !== null
      ? (() => {
          const tolerance = balanceTolerance({
            grade: level.grade,
            rotorMassKg: records.machine.rotorMassKg,
            speedRpm,
          });
          return {
            totalGmm: tolerance.permissibleUnbalanceGmm,
            perPlaneGmm:
              records.machine.planes.length > 1
                ? tolerance.planes.map((plane) => plane.permissibleUnbalanceGmm)
                : [tolerance.permissibleUnbalanceGmm],
            speedRpm,
            rotorMassKg: records.machine.rotorMassKg,
          };
        })()
      : null;
  return {
    jobId: job.id,
    jobNumber: jobNumber(job.id),
    jobVersion: job.version,
    shopName: records.shopName,
    customer: records.customer,
    machine: {
      make: job.machine.make,
      model: job.machine.model,
      serialNumber: job.machine.serialNumber,
      hours: records.machine.hours,
      familyName: job.machine.familyName,
      rotorMassKg: records.machine.rotorMassKg,
      planeCount: Math.max(1, records.machine.planes.length),
      correctionRadiiMm: records.machine.planes.map((plane) => plane.correctionRadiusMm),
    },
    technician: job.technician.name,
    scheduledFor: job.scheduledFor,
    completedAt: job.completion?.completedAt ?? null,
    completedBy: job.completion?.by.name ?? null,
    safety: job.safety && {
      topicIds: job.safety.topicIds,
      at: job.safety.acknowledgedAt,
      by: job.safety.by.name,
    },
    inspection: job.inspection && {
      bearingEndPlayMm: job.inspection.bearingEndPlayMm,
      shaftRunoutMm: job.inspection.shaftRunoutMm,
      limits: job.inspection.limits,
      checks: job.inspection.checks,
      notes: job.inspection.notes,
      passed: job.inspection.passed,
      reasons: job.inspection.reasons,
      at: job.inspection.measuredAt,
      by: job.inspection.by.name,
      override: job.inspection.override && {
        reason: job.inspection.override.reason,
        at: job.inspection.override.at,
        by: job.inspection.override.by.name,
      },
    },
    setup: job.setup && {
      unit: job.setup.amplitudeUnit,
      phaseSense: job.setup.phaseSense,
      weightAngles: job.setup.weightAngles,
      rotationSeenFromLeft: job.setup.rotationSeenFromLeft,
      operatingSpeedRpm: job.setup.operatingSpeedRpm,
      sensors: job.setup.sensors,
      tachometer: job.setup.tachometer,
      referenceMark: job.setup.referenceMark,
    },
    readings,
    weights,
    earlierWeights,
    acceptance:
      level === null
        ? null
        : {
            level,
            source,
            sides: job.verification?.sides ?? [],
            accepted: job.completion?.accepted ?? job.verification?.accepted ?? false,
            permissible,
          },
  };
}

/** JSON with every object's keys sorted, so that equal data always hashes the same. */
function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, item]) => item !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([key, item]) => `${JSON.stringify(key)}:${canonicalJson(item)}`).join(',')}}`;
  }
  return JSON.stringify(value);
}

/**
 * The SHA-256 (hex) of what the report prints, without the job's version (a change that the report does
 * not show keeps a signed revision current).
 */
export function sourceSha256(source: ReportSource): string {
  const { jobVersion: _version, ...printed } = source;
  return createHash('sha256').update(canonicalJson(printed), 'utf8').digest('hex');
}
