import { HttpErrorResponse } from '@angular/common/http';
import { computed, DestroyRef, inject, Injectable, signal } from '@angular/core';
import { firstValueFrom, type Observable, race, retry, Subject, takeUntil, throwError, timer } from 'rxjs';
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

/**
 * One job on one screen: the job as the server stores it with its ETag, and the changes the steps make to it,
 * one at a time. Each change is sent on the stored ETag; a change that meets no connection or a failing server
 * is sent again (1 s, 2 s, 4 s… then every 30 s) until it lands, with the screen saying so and a "Try now";
 * a change refused because the job changed meanwhile (412) shows the job as stored, which holds the change
 * itself when only its answer was lost. What a step has typed but not yet stored is kept by `JobDrafts`, so a
 * reload loses nothing. Provide it on the job's page.
 */
@Injectable()
export class JobSession {
  private readonly api = inject(JobsApi);
  private readonly stopped = new Subject<void>();
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
  }

  /** Fetches the job (again), trying again by itself while the connection or the server fails. */
  async load(id: number): Promise<void> {
    this.loadFailure.set(null);
    try {
      const job = await firstValueFrom(
        this.api.get(id).pipe(this.retryingTransient('Opening the job'), takeUntil(this.stopped)),
      );
      this.stored.set(job);
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
    this.state.set({ kind: 'saving', what });
    let attempts = 1;
    try {
      const saved = await firstValueFrom(
        change(this.api, current.record.id, current.etag).pipe(
          this.retryingTransient(what, () => attempts++),
          takeUntil(this.stopped),
        ),
      );
      this.stored.set(saved);
      this.state.set({ kind: 'saved', what, at: new Date() });
      return { ok: true, job: saved.record };
    } catch (error) {
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

  private retryingTransient<T>(what: string, onAttempt?: () => void) {
    return retry<T>({
      delay: (error: unknown, attempt: number) => {
        if (!isTransient(error)) return throwError(() => error);
        const delayMs = retryDelayMs(attempt);
        this.state.set({ kind: 'retrying', what, attempt, delayMs, reason: httpErrorMessage(error) });
        onAttempt?.();
        return race(timer(delayMs), this.tryNow);
      },
    });
  }
}
