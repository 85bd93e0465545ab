import type { Job, JobsHome, JobSummary } from './jobs.api';

/*
 * Invented jobs of an invented shop, for the specs of the jobs list, the home page and the dialogs. Names,
 * makes and serial numbers are made up.
 */

/** A machine as a job carries it. */
export function aJobMachine(overrides: Partial<JobSummary['machine']> = {}): JobSummary['machine'] {
  return {
    id: 12,
    serialNumber: 'TM225-0419',
    make: 'Thornmill',
    model: 'FM-225',
    customerId: 7,
    customerName: 'Bramblecote Estate Services',
    familyId: 4,
    familyName: 'Thornmill FM-225 mulcher heads',
    ...overrides,
  };
}

/** A job in a list, as the API answers it: open, Suvi Achterberg's (the test technician). */
export function aJobSummary(overrides: Partial<JobSummary> = {}): JobSummary {
  return {
    id: 31,
    version: 4,
    status: 'open',
    scheduledFor: '2026-12-04',
    machine: aJobMachine(),
    technician: { id: 3, name: 'Suvi Achterberg' },
    updatedAt: '2026-12-04T10:15:00.000Z',
    ...overrides,
  };
}

/** A whole job as the API answers it, newly started (only what the summary has, the steps not done). */
export function aJob(overrides: Partial<Job> = {}): Job {
  const { id, version, status, scheduledFor, machine, technician, updatedAt } = aJobSummary();
  return {
    id,
    version,
    status,
    nextStep: 'safety',
    scheduledFor,
    machine,
    technician,
    createdAt: '2026-12-04T08:00:00.000Z',
    updatedAt,
    safety: null,
    inspection: null,
    setup: null,
    runs: [],
    corrections: [],
    verification: null,
    completion: null,
    abandonment: null,
    ...overrides,
  };
}

/** A day as `GET /jobs/home` answers it: nothing in it unless given. */
export function aJobsHome(overrides: Partial<JobsHome> = {}): JobsHome {
  return { myOpenJobs: [], waitingForManager: [], machinesDue: [], dueAfterDays: 365, ...overrides };
}
