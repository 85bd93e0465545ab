import { HttpErrorResponse } from '@angular/common/http';
import { computed, DestroyRef, effect, inject, Injectable, signal, untracked } from '@angular/core';
import { firstValueFrom, type Observable, race, retry, Subject, takeUntil, throwError, timer } from 'rxjs';
import { captureChange } from '../offline/change-capture';
import { isNoAnswer } from '../offline/connection';
import { OfflineJobs, type PendingJobChange, type SettledJob } from '../offline/offline-jobs';
import { httpErrorMessage } from '../shell/server-errors';
import { type Job, JobsApi, type VersionedJob } from './jobs.api';

/** Where the job's last change stands, for the line under the job's heading. */
export type SaveState =
  | { readonly kind: 'idle' }
  /** Sent, no answer yet. */
  | { readonly kind: 'saving'; readonly what: string }
  /** The connection or the server failed; the same change is sent again after `delayMs`. */
  | {
      readonly kind: 'retrying';
      readonly what: string;
      readonly attempt: number;
      readonly delayMs: number;
      readonly reason: string;
    }
  /** Stored on the server. */
  | { readonly kind: 'saved'; readonly what: string; readonly at: Date }
  /** No connection: kept on the device, in the queue, to be sent when the connection returns. */
  | { readonly kind: 'queued'; readonly what: string; readonly at: Date }
  /** The server refused it (bad input, a step out of order…); the step shows why beside its fields. */
  | { readonly kind: 'refused'; readonly what: string; readonly message: string }
  /** The job changed on the server meanwhile; the screen now shows it as stored. */
  | { readonly kind: 'changed-meanwhile'; readonly what: string; readonly message: string };

/** How a change ended: stored, or refused with the error (for the step to put on its fields). */
export type SaveOutcome =
  { readonly ok: true; readonly job: Job } | { readonly ok: false; readonly error: unknown };

/** A change of the job, made on the ETag it is given. */
export type JobChange = (api: JobsApi, id: number, etag: string) => Observable<VersionedJob>;

/** The waits before the first new attempts; every later one waits 30 s. */
const RETRY_DELAYS_MS = [1000, 2000, 4000, 8000, 15_000];

/** Waits before the n-th new attempt (1, 2, 4, 8, 15, then 30 s): soon after a blip, gently on a long outage. */
export function retryDelayMs(attempt: number): number {
  return RETRY_DELAYS_MS[attempt - 1] ?? 30_000;
}

/**
 * A failure worth sending the same change again for: no answer at all (status 0: no signal, a closed lid,
 * the server restarting), a gateway or server failure, or "too many requests". A refusal of the change itself
 * (400, 403, 409, 412…) is not: sending it again would get the same answer.
 */
export function isTransient(error: unknown): boolean {
  if (!(error instanceof HttpErrorResponse)) return false;
  return error.status === 0 || error.status === 429 || error.status >= 500;
}

/** What the save line says once a change kept offline has reached the server. */
export const SENT_FROM_DEVICE = 'sent from this device';

/** What the save line says of a change that needs the server when there is no connection. */
export const NEEDS_CONNECTION =
  'This needs a connection to the server: it cannot wait on this device. Try again once the status says online.';

/**
 * One job on one screen: the job as the server stores it with its ETag, and the changes the steps make to it,
 * one at a time. Each change is sent on the stored ETag; a change that meets no connection (or is made while
 * offline, or while earlier changes of the job still wait) goes into the device's queue (`OfflineJobs`), and
 * the screen shows the job as it will be, by the server's own rules, until the queue has been sent. A change
 * that needs the server (completing, abandoning…) says so when offline. A change that meets a failing server
 * is sent again (1 s, 2 s, 4 s… then every 30 s) until it lands, with the screen saying so and a "Try now";
 * a change refused because the job changed meanwhile (412) shows the job as stored, which holds the change
 * itself when only its answer was lost. What a step has typed but not yet stored is kept by `JobDrafts`, so a
 * reload loses nothing. Provide it on the job's page.
 */
@Injectable()
export class JobSession {
  private readonly api = inject(JobsApi);
  private readonly offline = inject(OfflineJobs);
  private readonly stopped = new Subject<void>();
  private readonly jobId = signal<number | null>(null);
  private lastSent: SettledJob | null = null;
  /** What was kept on the device since the job was last sent, for the line once it is. */
  private queuedWhats: string[] = [];
  private readonly tryNow = new Subject<void>();

  private readonly stored = signal<VersionedJob | null>(null);
  private readonly loadFailure = signal<string | null>(null);
  private readonly state = signal<SaveState>({ kind: 'idle' });

  /** The job as stored, with its ETag; null until it is fetched. */
  readonly versioned = this.stored.asReadonly();
  /** The job as stored; null until it is fetched. */
  readonly job = computed(() => this.stored()?.record ?? null);
  /** Why the job could not be fetched; null otherwise. */
  readonly loadError = this.loadFailure.asReadonly();
  /** Where the last change stands. */
  readonly saveState = this.state.asReadonly();
  /** True while a change is sent or waits to be sent again: the steps hold their next one. */
  readonly busy = computed(() => {
    const kind = this.state().kind;
    return kind === 'saving' || kind === 'retrying';
  });
  /** The job's changes waiting on the device to be sent, in order. */
  readonly pending = computed((): readonly PendingJobChange[] => {
    const id = this.jobId();
    return id === null ? [] : this.offline.pendingFor(id)();
  });
  /** Whether the server can be reached now. */
  readonly online = this.offline.online;
  /** The conflict that holds the job's waiting changes back, if any. */
  readonly conflict = computed(() => {
    const id = this.jobId();
    return id === null ? null : this.offline.conflictFor(id);
  });
  /** True when the job takes changes: open, or on hold (for the inspection and a manager's decisions). */
  readonly changeable = computed(() => {
    const status = this.job()?.status;
    return status === 'open' || status === 'on-hold';
  });

  constructor() {
    inject(DestroyRef).onDestroy(() => {
      this.stopped.next();
      this.stopped.complete();
    });
    // Once every change kept on the device is stored on the server, the job is shown as the server has it.
    effect(() => {
      const id = this.jobId();
      if (id === null) return;
      const sent = this.offline.sentJob(id);
      if (sent === null || sent === this.lastSent || this.offline.pendingFor(id)().length > 0) return;
      this.lastSent = sent;
      untracked(() => {
        this.stored.set(sent.job);
        if (sent.discarded) {
          this.queuedWhats = [];
          if (!this.busy()) this.state.set({ kind: 'idle' });
          return;
        }
        const what =
          this.queuedWhats.length > 0
            ? `${this.queuedWhats.join(', ')} (${SENT_FROM_DEVICE})`
            : SENT_FROM_DEVICE;
        this.queuedWhats = [];
        if (!this.busy()) this.state.set({ kind: 'saved', what, at: new Date() });
      });
    });
  }

  /**
   * Fetches the job (again), trying again by itself while the connection or the server fails; with no
   * connection, the copy kept on the device. Changes waiting on the device are shown applied.
   */
  async load(id: number): Promise<void> {
    this.loadFailure.set(null);
    this.jobId.set(id);
    try {
      const job = await firstValueFrom(
        this.api.get(id).pipe(this.retryingTransient('Opening the job'), takeUntil(this.stopped)),
      );
      this.lastSent = this.offline.sentJob(id);
      const waiting = this.offline.pendingFor(id)();
      this.stored.set(waiting.length > 0 ? { record: waiting.at(-1)!.after, etag: job.etag } : job);
      if (this.state().kind === 'retrying') this.state.set({ kind: 'idle' });
    } catch (error) {
      this.loadFailure.set(httpErrorMessage(error));
      this.state.set({ kind: 'idle' });
    }
  }

  /**
   * Sends one change of the job (`what` names it for the screen: "Readings of run 3"), on the stored ETag.
   * Resolves once it is stored or refused; a change asked while another is on its way is refused at once.
   */
  async save(what: string, change: JobChange): Promise<SaveOutcome> {
    const current = this.stored();
    if (current === null || this.busy()) {
      return { ok: false, error: new Error('Another change of this job is still being saved.') };
    }
    if (this.offline.mustQueue(current.record.id)) return this.queue(what, change, current);
    const queueable = captureChange(change, current.record) !== null;
    this.state.set({ kind: 'saving', what });
    let attempts = 1;
    try {
      const saved = await firstValueFrom(
        change(this.api, current.record.id, current.etag).pipe(
          this.retryingTransient(what, () => attempts++, queueable),
          takeUntil(this.stopped),
        ),
      );
      this.stored.set(saved);
      this.state.set({ kind: 'saved', what, at: new Date() });
      return { ok: true, job: saved.record };
    } catch (error) {
      // No connection: the change waits on the device (if the server did store it, the replay finds it there).
      if (queueable && isNoAnswer(error)) return this.queue(what, change, current);
      const meanwhile = this.api.changedMeanwhile(error);
      if (meanwhile) {
        this.stored.set({ record: meanwhile.record, etag: meanwhile.etag });
        this.state.set({
          kind: 'changed-meanwhile',
          what,
          message:
            attempts > 1
              ? 'The connection dropped before the server answered. The job is shown as stored: check that your change is in it before you enter it again.'
              : 'This job was changed on another screen meanwhile. It is shown as stored now; what you typed is still in the form.',
        });
      } else {
        this.state.set({ kind: 'refused', what, message: httpErrorMessage(error) });
      }
      return { ok: false, error };
    }
  }

  /** Sends a change that waits to be sent again now, without waiting for its turn. */
  retryNow(): void {
    this.tryNow.next();
  }

  /** Sets the last change's message aside once it has been read. */
  dismiss(): void {
    if (!this.busy()) this.state.set({ kind: 'idle' });
  }

  /** Puts the change in the device's queue and shows the job as it will be; refuses one that needs the server. */
  private async queue(what: string, change: JobChange, current: VersionedJob): Promise<SaveOutcome> {
    const captured = captureChange(change, current.record);
    if (captured === null) {
      this.state.set({ kind: 'refused', what, message: NEEDS_CONNECTION });
      return { ok: false, error: new Error(NEEDS_CONNECTION) };
    }
    this.state.set({ kind: 'saving', what });
    try {
      const queued = await this.offline.enqueue(current.record, captured, what);
      this.stored.set({ record: queued.after, etag: current.etag });
      this.queuedWhats.push(what);
      this.state.set({ kind: 'queued', what, at: new Date() });
      return { ok: true, job: queued.after };
    } catch (error) {
      this.state.set({ kind: 'refused', what, message: httpErrorMessage(error) });
      return { ok: false, error };
    }
  }

  private retryingTransient<T>(what: string, onAttempt?: () => void, queueable = false) {
    return retry<T>({
      delay: (error: unknown, attempt: number) => {
        if (!isTransient(error)) return throwError(() => error);
        if (queueable && isNoAnswer(error)) return throwError(() => error);
        const delayMs = retryDelayMs(attempt);
        this.state.set({ kind: 'retrying', what, attempt, delayMs, reason: httpErrorMessage(error) });
        onAttempt?.();
        return race(timer(delayMs), this.tryNow);
      },
    });
  }
}
