import type {
  InstalledWeight,
  Job,
  JobCorrection,
  JobRun,
  RunRetype,
  StoredSensitivity,
} from '@counterpoise/api';

/*
 * What the jobs' JSON columns hold. People are stored by id (`byId`) and named when a job is read, so
 * that a renamed person shows under their current name; times are ISO strings.
 */

/** The safety acknowledgement. */
export interface StoredSafety {
  readonly topicIds: NonNullable<Job['safety']>['topicIds'];
  readonly acknowledgedAt: string;
  readonly byId: number;
}

/** The inspection as measured and judged, with a manager's override if any. */
export interface StoredInspection extends Omit<NonNullable<Job['inspection']>, 'by' | 'override'> {
  readonly byId: number;
  readonly override: { readonly reason: string; readonly at: string; readonly byId: number } | null;
}

/** The set-up of the instrument. */
export type StoredSetup = NonNullable<Job['setup']>;

/** Why and when a job was abandoned, and its reopening. */
export interface StoredAbandonment {
  readonly reason: string;
  readonly at: string;
  readonly byId: number;
  readonly reopenedAt: string | null;
  readonly reopenedById: number | null;
}

/** The completion of a job. */
export interface StoredCompletion extends Omit<NonNullable<Job['completion']>, 'by'> {
  readonly byId: number;
}

/** A sensor's reading of a run, as stored. */
export type StoredSensorReading = JobRun['readings'][number];
/** One retyping of a run's readings: when, who, and the readings and trial weight typed before it. */
export interface StoredRunRetype extends Omit<RunRetype, 'by'> {
  readonly byId: number;
}
/** A weight in a plane, as stored. */
export type StoredPlaneWeight = JobRun['weightsOnRotor'][number];
/** The calculator route and request of a correction. */
export type StoredCalc = JobCorrection['calc'];
/** A sensor's predicted reading. */
export type StoredPrediction = NonNullable<JobCorrection['predicted']>;
export type { InstalledWeight, StoredSensitivity };
