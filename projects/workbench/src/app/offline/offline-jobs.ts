import { HttpErrorResponse } from '@angular/common/http';
import {
  computed,
  DestroyRef,
  effect,
  inject,
  Injectable,
  type Signal,
  signal,
  untracked,
} from '@angular/core';
import type { Job, Machine, MachineFamily } from '@counterpoise/api';
import { firstValueFrom, type Observable } from 'rxjs';
import { AuthSession } from '../auth/auth-session';
import { JobsApi, type VersionedJob } from '../jobs/jobs.api';
import { MachineFamiliesApi } from '../machine-families/machine-families.api';
import { MachinesApi } from '../machines/machines.api';
import { problemOf, httpErrorMessage } from '../shell/server-errors';
import { Connection, isNoAnswer } from './connection';
import type { LocalJobContext, OfflineJobChange } from './local-rules';
import { OFFLINE_STORAGE, OfflineRecords } from './offline-records';
import type { CorrectionDisagreement, DiscardedChanges, JobConflict, QueuedChange } from './offline-storage';
import { type JobChangeSender, replayJob, type SendFailure, type ServerJob } from './replay';

export type { CorrectionDisagreement, DiscardedChanges, JobConflict } from './offline-storage';

/** A change of a job waiting on the device to be sent. */
export type PendingJobChange = QueuedChange;

/** The job as stored once the device's changes of it are settled: sent, or discarded by the person. */
export interface SettledJob {
  readonly job: VersionedJob;
  readonly discarded: boolean;
}

/** Where the device's link with the server stands, for the shell's status. */
export type SyncActivity =
  { readonly kind: 'idle' } | { readonly kind: 'sending'; readonly left: number; readonly what: string };

/**
 * The job's rules and the engine, loaded when first needed: the status in the shell and the queue do not make
 * every page pay for them (the service worker keeps the chunk for offline use).
 */
const localRules = () => import('./local-rules');

/** A refusal as the rules and the server state it. */
interface Refusal {
  readonly status: number;
  readonly title: string;
  readonly detail: string;
  readonly errors?: readonly { readonly path: string; readonly message: string }[];
  readonly code?: string;
}

/** After a failure of the server (5xx), the queue is tried again this much later. */
const RETRY_AFTER_SERVER_FAILURE_MS = 30_000;

/** The kept addresses of a job, its machine and its family. */
const jobUrl = (id: number) => `/api/v1/jobs/${id}`;
const machineUrl = (id: number) => `/api/v1/machines/${id}`;
const familyUrl = (id: number) => `/api/v1/machine-families/${id}`;

/**
 * The device's side of working with no connection, for the signed-in person: the changes of jobs made
 * without a connection, waiting in IndexedDB in the order they were made (each with the job as it will be, by
 * the same rules as the server's), sent when the connection returns; the conflicts and refusals met on the
 * way, for a person to resolve; the corrections the server computed differently from the device; and the
 * technician's day kept on the device while online. docs/offline.md tells the whole story.
 */
@Injectable({ providedIn: 'root' })
export class OfflineJobs {
  private readonly storage = inject(OFFLINE_STORAGE);
  private readonly records = inject(OfflineRecords);
  private readonly connection = inject(Connection);
  private readonly auth = inject(AuthSession);
  private readonly jobsApi = inject(JobsApi);
  private readonly machinesApi = inject(MachinesApi);
  private readonly familiesApi = inject(MachineFamiliesApi);

  private readonly queueState = signal<readonly QueuedChange[]>([]);
  private readonly conflictState = signal<readonly JobConflict[]>([]);
  private readonly disagreementState = signal<readonly CorrectionDisagreement[]>([]);
  private readonly discardedState = signal<readonly DiscardedChanges[]>([]);
  private readonly activityState = signal<SyncActivity>({ kind: 'idle' });
  private readonly sentState = signal<ReadonlyMap<number, SettledJob>>(new Map());
  private readonly pendingByJob = new Map<number, Signal<readonly PendingJobChange[]>>();
  private readonly disagreementsByJob = new Map<number, Signal<readonly CorrectionDisagreement[]>>();
  private syncing: Promise<void> | null = null;
  private again = false;
  private retryTimer: ReturnType<typeof setTimeout> | null = null;
  private keptDayOf: number | null = null;
  private keepsToday = false;

  /** Every change waiting to be sent, in order. */
  readonly queue = this.queueState.asReadonly();
  /** The jobs whose changes met a change made meanwhile on the server. */
  readonly conflicts = this.conflictState.asReadonly();
  /** Corrections the server computed differently from the device. */
  readonly disagreements = this.disagreementState.asReadonly();
  /** Changes the person discarded, kept for them to read until dismissed. */
  readonly discarded = this.discardedState.asReadonly();
  /** Sending or not. */
  readonly activity = this.activityState.asReadonly();
  /** The changes the server refused, waiting for the person. */
  readonly refused = computed(() => this.queueState().filter((c) => c.refusal !== null));
  /** Whether the device reaches the server now. */
  readonly online = this.connection.online;

  constructor() {
    // The person's queue, conflicts and disagreements, read again when someone else signs in.
    effect(() => {
      const userId = this.auth.user()?.id ?? null;
      untracked(() => void this.reload(userId));
    });
    // Whenever the server can be reached: the session first, then the queue, then today's jobs.
    effect(() => {
      const online = this.connection.online();
      const userId = this.auth.user()?.id;
      // The day is read again each time the connection returns.
      if (!online) this.keptDayOf = null;
      if (!online || userId === undefined) return;
      untracked(() => void this.whenOnline());
    });
    const ended = this.auth.ended.subscribe((userId) => {
      this.keptDayOf = null;
      void this.records.clear(userId);
    });
    inject(DestroyRef).onDestroy(() => {
      ended.unsubscribe();
      if (this.retryTimer !== null) clearTimeout(this.retryTimer);
    });
  }

  /**
   * From now on, keeps the signed-in technician's day on the device whenever the server can be reached: their
   * open jobs, and each one's machine and family (the app turns this on at start; specs leave it off).
   */
  keepTodayOnDevice(): void {
    this.keepsToday = true;
    if (this.connection.online() && this.auth.user() && !this.auth.offline()) void this.keepToday();
  }

  /** What waits to be sent for this job, in order. */
  pendingFor(jobId: number): Signal<readonly PendingJobChange[]> {
    let pending = this.pendingByJob.get(jobId);
    if (!pending) {
      pending = computed(() => this.queueState().filter((c) => c.jobId === jobId));
      this.pendingByJob.set(jobId, pending);
    }
    return pending;
  }

  /** The corrections of this job the server computed differently from the device. */
  disagreementsFor(jobId: number): Signal<readonly CorrectionDisagreement[]> {
    let found = this.disagreementsByJob.get(jobId);
    if (!found) {
      found = computed(() => this.disagreementState().filter((d) => d.jobId === jobId));
      this.disagreementsByJob.set(jobId, found);
    }
    return found;
  }

  /** The conflict met sending this job's changes, if any. */
  conflictFor(jobId: number): JobConflict | null {
    return this.conflictState().find((c) => c.jobId === jobId) ?? null;
  }

  /**
   * The job as the server stores it once this device's changes of it are settled: all sent, or discarded by
   * the person (`discarded`); null until then.
   */
  sentJob(jobId: number): SettledJob | null {
    return this.sentState().get(jobId) ?? null;
  }

  /** Whether a change of this job must wait on the device: no connection, or changes before it wait. */
  mustQueue(jobId: number): boolean {
    return !this.connection.online() || this.auth.offline() || this.pendingFor(jobId)().length > 0;
  }

  /**
   * Applies a change to the job as the device shows it, by the server's rules, and queues it to be sent.
   * Resolves with the job as it will be; rejects with the rules' refusal as the server would answer it (an
   * `HttpErrorResponse` with the problem), so that the step puts it on its fields.
   */
  async enqueue(job: Job, change: OfflineJobChange, what: string): Promise<PendingJobChange> {
    const user = this.auth.user();
    if (!user) throw new Error('Sign in to change the job.');
    const { applyJobChange, JobChangeRefusal } = await localRules();
    const context = await this.contextOf(job);
    let after: Job;
    try {
      after = applyJobChange(job, change, context, {
        actor: { id: user.id, name: user.name },
        at: new Date(),
      });
    } catch (error) {
      throw error instanceof JobChangeRefusal ? refusalAsHttpError(error) : error;
    }
    const before = this.pendingFor(job.id)();
    const queued = await this.storage.addChange({
      userId: user.id,
      jobId: job.id,
      change,
      what,
      queuedAt: new Date().toISOString(),
      baseVersion: before[0]?.baseVersion ?? job.version,
      after,
      refusal: null,
    });
    this.queueState.update((queue) => [...queue, queued]);
    if (this.connection.online() && !this.auth.offline()) void this.sync();
    return queued;
  }

  /** Sends every waiting change now, job by job, if the server can be reached. */
  sync(): Promise<void> {
    if (this.syncing) {
      this.again = true;
      return this.syncing;
    }
    // One sender per device: another tab of the workbench waits for this one (Web Locks, where the browser has
    // them); within this tab, one at a time.
    const locks = typeof navigator === 'undefined' ? undefined : navigator.locks;
    const sending: Promise<void> = locks
      ? locks.request('counterpoise-offline-queue', () => this.sendAll()).then(() => undefined)
      : this.sendAll();
    const syncing = sending.finally(() => {
      this.syncing = null;
      this.activityState.set({ kind: 'idle' });
      if (this.again) {
        this.again = false;
        void this.sync();
      }
    });
    this.syncing = syncing;
    return syncing;
  }

  /**
   * Resolves a conflict by sending the device's changes on top of the job as stored now: each is sent again,
   * in order, on the current version; one the server then refuses is shown again.
   */
  async sendMineOnTop(jobId: number): Promise<void> {
    const user = this.auth.user();
    const conflict = this.conflictFor(jobId);
    if (!user || !conflict) return;
    const { applyJobChange } = await localRules();
    let shown = conflict.current;
    const context = await this.contextOf(conflict.current).catch(() => null);
    for (const change of this.pendingFor(jobId)()) {
      // The job as it will be, on the current version, when the rules allow it; else as it was.
      try {
        if (context)
          shown = applyJobChange(shown, change.change, context, {
            actor: { id: user.id, name: user.name },
            at: new Date(change.queuedAt),
          });
      } catch {
        // The server will say why.
      }
      await this.storage.putChange({
        ...change,
        baseVersion: conflict.current.version,
        after: shown,
        refusal: null,
      });
    }
    await this.records.write(user.id, jobUrl(jobId), conflict.current, conflict.etag);
    await this.storage.removeConflict(user.id, jobId);
    await this.reload(user.id);
    await this.sync();
  }

  /**
   * Resolves a conflict or a refusal by discarding the device's waiting changes of the job: a list of what
   * was discarded stays for the person to read until they dismiss it.
   */
  async discardMine(jobId: number): Promise<void> {
    const user = this.auth.user();
    if (!user) return;
    const pending = this.pendingFor(jobId)();
    if (pending.length > 0) {
      await this.storage.addDiscarded({
        userId: user.id,
        jobId,
        changes: pending.map((c) => ({ what: c.what, queuedAt: c.queuedAt })),
        discardedAt: new Date().toISOString(),
      });
    }
    for (const change of pending) await this.storage.removeChange(change.key);
    const conflict = this.conflictFor(jobId);
    if (conflict) {
      await this.records.write(user.id, jobUrl(jobId), conflict.current, conflict.etag);
      this.markSent({ record: conflict.current, etag: conflict.etag }, true);
      await this.storage.removeConflict(user.id, jobId);
    } else {
      const kept = await this.records.read<Job>(user.id, jobUrl(jobId));
      if (kept) {
        this.markSent({ record: kept.body, etag: kept.etag ?? `"${kept.body.version}"` }, true);
      }
    }
    await this.reload(user.id);
  }

  /** Sends a refused change again (after the cause was fixed elsewhere, a role granted…). */
  async tryAgain(jobId: number): Promise<void> {
    const refused = this.pendingFor(jobId)().find((c) => c.refusal !== null);
    if (refused) await this.storage.putChange({ ...refused, refusal: null });
    await this.reload(this.auth.user()?.id ?? null);
    await this.sync();
  }

  /** Forgets a list of discarded changes once read. */
  async dismissDiscarded(key: number): Promise<void> {
    await this.storage.removeDiscarded(key);
    this.discardedState.update((all) => all.filter((d) => d.key !== key));
  }

  /** Forgets a disagreement once the person has checked the weights. */
  async dismissDisagreement(disagreement: CorrectionDisagreement): Promise<void> {
    await this.storage.removeDisagreement(
      disagreement.userId,
      disagreement.jobId,
      disagreement.correctionSequence,
    );
    this.disagreementState.update((all) => all.filter((d) => d !== disagreement));
  }

  /** What the local rules need besides the job: its machine and family as kept on the device. */
  private async contextOf(job: Job): Promise<LocalJobContext> {
    const userId = this.auth.user()?.id ?? -1;
    const machine = await this.records.read<Machine>(userId, machineUrl(job.machine.id));
    if (!machine) {
      throw refusalAsHttpError({
        status: 503,
        title: 'The machine is not on this device',
        detail:
          'The machine of this job was not kept on this device before the connection dropped, so the change cannot be checked here. Try again with a connection.',
      });
    }
    const familyId = machine.body.familyId ?? null;
    if (familyId === null) return { machine: machine.body, family: null };
    const family = await this.records.read<MachineFamily>(userId, familyUrl(familyId));
    if (!family) {
      throw refusalAsHttpError({
        status: 503,
        title: 'The machine family is not on this device',
        detail:
          'The machine family of this job was not kept on this device before the connection dropped, so the change cannot be checked here. Try again with a connection.',
      });
    }
    return { machine: machine.body, family: family.body };
  }

  private async whenOnline(): Promise<void> {
    if (this.auth.offline() && !(await this.auth.reconnect())) return;
    await this.sync();
    await this.keepToday();
  }

  private async sendAll(): Promise<void> {
    const user = this.auth.user();
    if (!user || !this.connection.online() || this.auth.offline()) return;
    await this.reload(user.id);
    const conflicted = new Set(this.conflictState().map((c) => c.jobId));
    const { compareCorrections } = await localRules();
    const jobIds = [...new Set(this.queueState().map((c) => c.jobId))].filter((id) => !conflicted.has(id));
    for (const jobId of jobIds) {
      const outcome = await replayJob(
        {
          storage: this.storage,
          sender: this.sender,
          keptJob: async (id) => {
            const kept = await this.records.read<Job>(user.id, jobUrl(id));
            return kept ? { record: kept.body, etag: kept.etag ?? `"${kept.body.version}"` } : null;
          },
          keepJob: (job) => this.records.write(user.id, jobUrl(job.record.id), job.record, job.etag),
          compareCorrections,
          now: () => new Date(),
          onSending: (change, left) => this.activityState.set({ kind: 'sending', left, what: change.what }),
        },
        user.id,
        jobId,
      );
      await this.reload(user.id);
      if (outcome.kind === 'sent' && outcome.job) this.markSent(outcome.job);
      if (outcome.kind === 'stopped') {
        if (outcome.reason === 'no-answer') this.connection.reportNoAnswer();
        if (outcome.reason === 'server-failing') this.retryLater();
        return;
      }
    }
  }

  /** The technician's day, each open job, its machine and its family, read so that the device keeps them. */
  private async keepToday(): Promise<void> {
    const user = this.auth.user();
    if (!this.keepsToday || !user || this.keptDayOf === user.id || !this.auth.can('jobs:read')) return;
    this.keptDayOf = user.id;
    try {
      const day = await firstValueFrom(this.jobsApi.home());
      for (const summary of day.myOpenJobs) {
        const job = await firstValueFrom(this.jobsApi.get(summary.id));
        await firstValueFrom(this.machinesApi.get(job.record.machine.id));
        const familyId = job.record.machine.familyId;
        if (familyId !== null) await firstValueFrom(this.familiesApi.get(familyId));
      }
    } catch {
      // Kept next time the connection returns.
      this.keptDayOf = null;
    }
  }

  private markSent(job: VersionedJob, discarded = false): void {
    this.sentState.update((all) => new Map(all).set(job.record.id, { job, discarded }));
  }

  private retryLater(): void {
    if (this.retryTimer !== null) return;
    this.retryTimer = setTimeout(() => {
      this.retryTimer = null;
      void this.sync();
    }, RETRY_AFTER_SERVER_FAILURE_MS);
  }

  private async reload(userId: number | null): Promise<void> {
    if (userId === null) {
      this.queueState.set([]);
      this.conflictState.set([]);
      this.disagreementState.set([]);
      this.discardedState.set([]);
      return;
    }
    try {
      const [queue, conflicts, disagreements, discarded] = await Promise.all([
        this.storage.changes(userId),
        this.storage.conflicts(userId),
        this.storage.disagreements(userId),
        this.storage.discarded(userId),
      ]);
      if (this.auth.user()?.id !== userId) return;
      this.queueState.set(queue);
      this.conflictState.set(conflicts);
      this.disagreementState.set(disagreements);
      this.discardedState.set(discarded);
    } catch {
      // IndexedDB refused (a private window with storage off): nothing was kept to show.
    }
  }

  /** The server through `JobsApi`, its failures told apart for the replay. */
  private readonly sender: JobChangeSender = {
    send: (jobId, change, etag, basis) =>
      sendOf(
        this.jobsApi.changedMeanwhile.bind(this.jobsApi),
        requestOf(this.jobsApi, jobId, change, etag, basis),
      ),
    read: (jobId) => sendOf(this.jobsApi.changedMeanwhile.bind(this.jobsApi), this.jobsApi.get(jobId)),
  };
}

/** The request that sends a queued change, on an ETag; `basis` is the job as stored that it is sent on. */
export function requestOf(
  api: JobsApi,
  jobId: number,
  change: OfflineJobChange,
  etag: string,
  basis: Job,
): Observable<VersionedJob> {
  switch (change.kind) {
    case 'acknowledge-safety':
      return api.acknowledgeSafety(jobId, change.body.topicIds, etag);
    case 'record-inspection':
      return api.recordInspection(jobId, change.body, etag);
    case 'record-setup':
      return api.recordSetup(jobId, change.body, etag);
    case 'add-run':
      return api.addRun(jobId, change.body, etag);
    case 'compute-correction':
      return api.computeCorrection(jobId, change.body.method, etag);
    case 'record-installed': {
      // A correction computed on this device gets its id from the server: found by its sequence.
      const correction = basis.corrections.find((c) => c.sequence === change.correctionSequence);
      return api.recordInstalled(jobId, correction?.id ?? -change.correctionSequence, change.body, etag);
    }
  }
}

async function sendOf(
  changedMeanwhile: (error: unknown) => { record: Job; etag: string } | null,
  request: Observable<VersionedJob>,
): Promise<ServerJob> {
  try {
    return await firstValueFrom(request);
  } catch (error) {
    throw failureOf(error, changedMeanwhile);
  }
}

/** A failed request as the replay tells failures apart. */
export function failureOf(
  error: unknown,
  changedMeanwhile: (error: unknown) => { record: Job; etag: string } | null,
): SendFailure {
  if (isNoAnswer(error)) return { kind: 'no-answer' };
  if (!(error instanceof HttpErrorResponse)) return { kind: 'server-failing', message: String(error) };
  const meanwhile = changedMeanwhile(error);
  if (meanwhile) return { kind: 'changed-meanwhile', current: meanwhile };
  if (error.status === 401) return { kind: 'signed-out' };
  if (error.status >= 500 || error.status === 429) {
    return { kind: 'server-failing', message: httpErrorMessage(error) };
  }
  const problem = problemOf(error);
  return {
    kind: 'refused',
    refusal: {
      status: error.status,
      message: httpErrorMessage(error),
      fields: (problem?.errors ?? []).map((e) => e.message),
    },
  };
}

/** The rules' refusal as the server would answer it, for the steps to read like the server's. */
export function refusalAsHttpError(refusal: Refusal): HttpErrorResponse {
  return new HttpErrorResponse({
    status: refusal.status,
    statusText: refusal.title,
    error: {
      type: 'about:blank',
      title: refusal.title,
      status: refusal.status,
      detail: refusal.detail,
      ...(refusal.code ? { code: refusal.code } : {}),
      ...(refusal.errors ? { errors: refusal.errors } : {}),
    },
  });
}
