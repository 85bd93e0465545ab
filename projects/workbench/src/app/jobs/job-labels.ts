import type { MachineFamily } from '../machine-families/machine-families.api';
import type { Machine } from '../machines/machines.api';
import type { Job, JobStatus, JobStep, JobSummary } from './jobs.api';

/** The steps of the stepper, in order, with the words a technician reads on them. */
export const JOB_STEP_LABELS: Readonly<Record<JobStep, string>> = {
  safety: 'Safety',
  inspection: 'Inspection',
  setup: 'Set-up',
  runs: 'Runs',
  correction: 'Correction',
  verification: 'Verification',
  completion: 'Completion',
};

/** The steps in the order the job goes through them. */
export const JOB_STEP_ORDER: readonly JobStep[] = [
  'safety',
  'inspection',
  'setup',
  'runs',
  'correction',
  'verification',
  'completion',
];

/** A job's state in a word or two. */
export const JOB_STATUS_LABELS: Readonly<Record<JobStatus, string>> = {
  open: 'Open',
  'on-hold': 'On hold',
  completed: 'Completed',
  abandoned: 'Abandoned',
};

/** A name for the job's machine in headings: make and model with the serial number, else what there is. */
export function machineTitle(machine: Job['machine'] | JobSummary['machine']): string {
  const makeModel = [machine.make, machine.model].filter(Boolean).join(' ');
  if (machine.serialNumber)
    return makeModel ? `${makeModel} · ${machine.serialNumber}` : machine.serialNumber;
  return makeModel || `Machine no. ${machine.id}`;
}

/**
 * How many correction planes the job's rotor has: the machine's, else its family's (while the machine is
 * fetched), else one per sensor of the set-up, at least one.
 */
export function planeCountOf(job: Job, machine?: Machine, family?: MachineFamily): number {
  return machine?.planes.length ?? family?.planeCount ?? Math.max(1, job.setup?.sensors.length ?? 1);
}

/** Whether the step is done on this job, for the stepper's ticks. */
export function stepDone(job: Job, step: JobStep): boolean {
  switch (step) {
    case 'safety':
      return job.safety !== null;
    case 'inspection':
      return job.inspection !== null && (job.inspection.passed || job.inspection.override !== null);
    case 'setup':
      return job.setup !== null;
    case 'runs':
      return job.runs.some((run) => run.kind === 'initial');
    case 'correction':
      return job.corrections.some((correction) => correction.installed !== null);
    case 'verification':
      return job.verification?.accepted === true;
    case 'completion':
      return job.completion !== null;
  }
}
