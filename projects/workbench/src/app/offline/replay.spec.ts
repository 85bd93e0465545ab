import type { Job, JobCorrection } from '@counterpoise/api';
import { describe, expect, it } from 'vitest';
import { aJob } from '../jobs/jobs-testing';
import type { OfflineJobChange } from './local-rules';
import { MemoryOfflineStorage, type QueuedChange } from './offline-storage';
import {
  holdsChange,
  type JobChangeSender,
  replayJob,
  type ReplayDeps,
  type SendFailure,
  type ServerJob,
} from './replay';

const USER = 3;
const PERSON = { id: USER, name: 'Suvi Achterberg' };
const AT = '2026-12-04T10:00:00.000Z';

/** A correction as the server stores it, with the plan given. */
function aCorrection(sequence: number, massGrams: number, id = 100 + sequence): JobCorrection {
  return {
    id,
    sequence,
    method: 'one-run',
    basis: 'sensitivity',
    runIds: [],
    calc: { route: 'one-run', request: {}, sensorSides: ['left'] },
    result: {},
    plan: [{ planeIndex: 0, massGrams, angleDeg: 340 }],
    installed: null,
    predicted: null,
    installedAt: null,
    warnings: [],
    createdAt: AT,
    by: PERSON,
  } as JobCorrection;
}

/**
 * A server of one job with the API's versioning: a change sent on another version than the stored one is
 * refused with the job as stored (412); each stored change moves the version on by one. What a change does to
 * the job is what the replay looks at (a step's record, one more run or correction, a correction's weights).
 * It can refuse a kind of change (409), and lose the answer of the next change it stores.
 */
class JobServer implements JobChangeSender {
  job: Job;
  refuseKind: OfflineJobChange['kind'] | null = null;
  loseNextAnswer = false;
  serverCorrectionGrams = 285.8;
  readonly received: string[] = [];

  constructor(job: Job) {
    this.job = job;
  }

  get etag(): string {
    return `"${this.job.version}"`;
  }

  async read(): Promise<ServerJob> {
    return { record: structuredClone(this.job), etag: this.etag };
  }

  async send(_jobId: number, change: OfflineJobChange, etag: string): Promise<ServerJob> {
    this.received.push(`${change.kind}@${etag}`);
    if (etag !== this.etag) {
      throw { kind: 'changed-meanwhile', current: await this.read() } satisfies SendFailure;
    }
    if (change.kind === this.refuseKind) {
      throw {
        kind: 'refused',
        refusal: { status: 409, message: 'Not at this step.', fields: [] },
      } satisfies SendFailure;
    }
    this.store(change);
    if (this.loseNextAnswer) {
      this.loseNextAnswer = false;
      throw { kind: 'no-answer' } satisfies SendFailure;
    }
    return this.read();
  }

  /** Someone else's change on the server. */
  changeMeanwhile(): void {
    this.job = { ...this.job, version: this.job.version + 1, updatedAt: '2026-12-04T11:00:00.000Z' };
  }

  private store(change: OfflineJobChange): void {
    const job = structuredClone(this.job);
    if (change.kind === 'acknowledge-safety') {
      job.safety = { topicIds: [...change.body.topicIds], acknowledgedAt: AT, by: PERSON };
    } else if (change.kind === 'add-run') {
      job.runs.push({
        id: 50 + job.runs.length,
        sequence: job.runs.length + 1,
        kind: change.body.kind,
        trialWeight: null,
        weightsOnRotor: [],
        readings: [],
        warnings: [],
        createdAt: AT,
        by: PERSON,
      });
    } else if (change.kind === 'compute-correction') {
      job.corrections.push(aCorrection(job.corrections.length + 1, this.serverCorrectionGrams));
    } else if (change.kind === 'record-installed') {
      const correction = job.corrections.find((c) => c.sequence === change.correctionSequence);
      if (correction) correction.installed = change.body.weights.map((w) => ({ ...w }));
    }
    job.version += 1;
    this.job = job;
  }
}

const RUN: OfflineJobChange = {
  kind: 'add-run',
  body: { kind: 'initial', readings: [] } as unknown as Extract<
    OfflineJobChange,
    { kind: 'add-run' }
  >['body'],
};
const COMPUTE: OfflineJobChange = { kind: 'compute-correction', body: { method: 'one-run' } };
const INSTALLED: OfflineJobChange = {
  kind: 'record-installed',
  correctionSequence: 1,
  body: { weights: [{ planeIndex: 0, massGrams: 285.8, angleDeg: 340, radiusMm: 210, fixing: 'welded' }] },
};

/** The device's side: the storage, the job it keeps, and the replay's other needs. */
function deviceOf(server: JobServer) {
  const storage = new MemoryOfflineStorage();
  let kept: ServerJob | null = { record: structuredClone(server.job), etag: server.etag };
  const deps: ReplayDeps = {
    storage,
    sender: server,
    keptJob: async () => kept,
    keepJob: async (job) => {
      kept = job;
    },
    compareCorrections: (device, stored) => {
      const a = device.plan[0]!.massGrams;
      const b = stored.plan[0]!.massGrams;
      return Math.abs(a - b) <= 0.1
        ? { agrees: true, differences: [] }
        : { agrees: false, differences: [`Left plane: ${b} g on the server, ${a} g on this device.`] };
    },
    now: () => new Date('2026-12-04T12:00:00.000Z'),
  };
  /** Queues changes made on the job as kept (version `base`), the device's correction of `deviceGrams`. */
  const queue = async (changes: OfflineJobChange[], base = server.job.version, deviceGrams = 285.8) => {
    for (const change of changes) {
      const after =
        change.kind === 'compute-correction'
          ? ({ ...server.job, corrections: [aCorrection(1, deviceGrams, -1)] } as Job)
          : server.job;
      await storage.addChange({
        userId: USER,
        jobId: server.job.id,
        change,
        what: change.kind,
        queuedAt: AT,
        baseVersion: base,
        after,
        refusal: null,
      });
    }
  };
  return { storage, deps, queue, kept: () => kept };
}

describe('replayJob', () => {
  it('sends the changes in order, each on the ETag of the answer before it, and empties the queue', async () => {
    const server = new JobServer(aJob({ version: 4 }));
    const device = deviceOf(server);
    await device.queue([RUN, COMPUTE, INSTALLED]);

    const outcome = await replayJob(device.deps, USER, server.job.id);

    expect(outcome).toMatchObject({ kind: 'sent', sent: 3 });
    expect(server.received).toEqual(['add-run@"4"', 'compute-correction@"5"', 'record-installed@"6"']);
    expect(server.job.corrections[0]?.installed).toHaveLength(1);
    expect(await device.storage.changes(USER)).toEqual([]);
    expect(device.kept()?.record.version).toBe(7);
    expect(await device.storage.disagreements(USER)).toEqual([]);
  });

  it('keeps the changes and records a conflict when the job changed on the server meanwhile', async () => {
    const server = new JobServer(aJob({ version: 4 }));
    const device = deviceOf(server);
    await device.queue([RUN, COMPUTE]);
    server.changeMeanwhile();

    const outcome = await replayJob(device.deps, USER, server.job.id);

    expect(outcome).toMatchObject({ kind: 'conflict', sent: 0 });
    expect(server.job.runs).toEqual([]);
    expect((await device.storage.changes(USER)).map((c) => c.change.kind)).toEqual([
      'add-run',
      'compute-correction',
    ]);
    const [conflict] = await device.storage.conflicts(USER);
    expect(conflict).toMatchObject({ jobId: server.job.id, etag: '"5"' });
    expect(conflict?.current.version).toBe(5);
  });

  it('stops the job’s queue at a refused change, marks it, and sends nothing after it', async () => {
    const server = new JobServer(aJob({ version: 4 }));
    const device = deviceOf(server);
    await device.queue([RUN, COMPUTE, INSTALLED]);
    server.refuseKind = 'compute-correction';

    const outcome = await replayJob(device.deps, USER, server.job.id);

    expect(outcome).toMatchObject({ kind: 'refused', sent: 1 });
    expect(server.received).toEqual(['add-run@"4"', 'compute-correction@"5"']);
    const left = await device.storage.changes(USER);
    expect(left.map((c) => [c.change.kind, c.refusal?.status ?? null])).toEqual([
      ['compute-correction', 409],
      ['record-installed', null],
    ]);
    // Asked again, a queue that starts with a refusal waits for the person.
    expect(await replayJob(device.deps, USER, server.job.id)).toMatchObject({ kind: 'refused', sent: 0 });
    expect(server.received).toHaveLength(2);
  });

  it('does not send twice a change whose answer was lost: it finds it in the job as stored', async () => {
    const server = new JobServer(aJob({ version: 4 }));
    const device = deviceOf(server);
    await device.queue([RUN, COMPUTE]);
    server.loseNextAnswer = true;

    // The run is stored, but its answer never arrives: everything stops, the queue is as it was.
    expect(await replayJob(device.deps, USER, server.job.id)).toMatchObject({
      kind: 'stopped',
      reason: 'no-answer',
    });
    expect(server.job.runs).toHaveLength(1);
    expect(await device.storage.changes(USER)).toHaveLength(2);

    // Sent again on its old ETag: the server's 412 holds the run, so it leaves the queue and the next goes on.
    const outcome = await replayJob(device.deps, USER, server.job.id);
    expect(outcome).toMatchObject({ kind: 'sent', sent: 2 });
    expect(server.job.runs).toHaveLength(1);
    expect(server.job.corrections).toHaveLength(1);
    expect(server.received).toEqual(['add-run@"4"', 'add-run@"4"', 'compute-correction@"5"']);
    expect(await device.storage.changes(USER)).toEqual([]);
  });

  it('stores each change once when two senders replay the same queue at the same moment', async () => {
    const server = new JobServer(aJob({ version: 4 }));
    const device = deviceOf(server);
    await device.queue([RUN, COMPUTE, INSTALLED]);

    await Promise.all([
      replayJob(device.deps, USER, server.job.id),
      replayJob(device.deps, USER, server.job.id),
    ]);

    expect(server.job.runs).toHaveLength(1);
    expect(server.job.corrections).toHaveLength(1);
    expect(server.job.corrections[0]?.installed).toHaveLength(1);
    expect(server.job.version).toBe(7);
    expect(await device.storage.changes(USER)).toEqual([]);
    expect(await device.storage.conflicts(USER)).toEqual([]);
  });

  it('stops with the queue untouched when the server cannot be reached', async () => {
    const server = new JobServer(aJob({ version: 4 }));
    const device = deviceOf(server);
    await device.queue([RUN]);
    const unreachable: JobChangeSender = {
      send: () => Promise.reject({ kind: 'no-answer' } satisfies SendFailure),
      read: () => Promise.reject({ kind: 'no-answer' } satisfies SendFailure),
    };

    const outcome = await replayJob({ ...device.deps, sender: unreachable }, USER, server.job.id);

    expect(outcome).toMatchObject({ kind: 'stopped', reason: 'no-answer', sent: 0 });
    expect(await device.storage.changes(USER)).toHaveLength(1);
  });

  it('keeps a disagreement when the server computed another correction than the device', async () => {
    const server = new JobServer(aJob({ version: 4, runs: [] }));
    server.serverCorrectionGrams = 301.2;
    const device = deviceOf(server);
    await device.queue([COMPUTE], 4, 285.8);

    await replayJob(device.deps, USER, server.job.id);

    const [disagreement] = await device.storage.disagreements(USER);
    expect(disagreement).toMatchObject({ jobId: server.job.id, correctionSequence: 1 });
    expect(disagreement?.differences).toEqual(['Left plane: 301.2 g on the server, 285.8 g on this device.']);
    expect(disagreement?.server.plan[0]?.massGrams).toBe(301.2);
    expect(disagreement?.device.plan[0]?.massGrams).toBe(285.8);
  });

  it('sends only the person’s own changes, and only this job’s', async () => {
    const server = new JobServer(aJob({ version: 4 }));
    const device = deviceOf(server);
    await device.queue([RUN]);
    const other: Omit<QueuedChange, 'key'> = {
      ...(await device.storage.changes(USER))[0]!,
      userId: 99,
    };
    await device.storage.addChange(other);
    await device.storage.addChange({ ...other, userId: USER, jobId: 77 });

    await replayJob(device.deps, USER, server.job.id);

    expect(server.received).toEqual(['add-run@"4"']);
    expect((await device.storage.changes(USER)).map((c) => c.jobId)).toEqual([77]);
    expect(await device.storage.changes(99)).toHaveLength(1);
  });
});

describe('holdsChange', () => {
  const basis = aJob({ version: 4 });

  it('finds a run, a correction and the safety acknowledgement stored by the change sent', () => {
    const run = { ...basis, version: 5, runs: [{ kind: 'initial' } as Job['runs'][number]] };
    expect(holdsChange(basis, run, RUN)).toBe(true);
    const correction = { ...basis, version: 5, corrections: [aCorrection(1, 200)] };
    expect(holdsChange(basis, correction, COMPUTE)).toBe(true);
    const safety = { ...basis, version: 5, safety: { topicIds: [], acknowledgedAt: AT, by: PERSON } };
    expect(holdsChange(basis, safety, { kind: 'acknowledge-safety', body: { topicIds: ['lockout'] } })).toBe(
      true,
    );
  });

  it('does not take another change for it: another kind, or more than one version on', () => {
    const trial = { ...basis, version: 5, runs: [{ kind: 'trial' } as Job['runs'][number]] };
    expect(holdsChange(basis, trial, RUN)).toBe(false);
    const twoOn = { ...basis, version: 6, runs: [{ kind: 'initial' } as Job['runs'][number]] };
    expect(holdsChange(basis, twoOn, RUN)).toBe(false);
    expect(holdsChange(basis, { ...basis, version: 5 }, COMPUTE)).toBe(false);
  });
});
