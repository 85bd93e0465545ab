import { HttpErrorResponse } from '@angular/common/http';
import { DestroyRef, inject, Injectable, InjectionToken, signal } from '@angular/core';

/**
 * Whether a failed request got no answer from the server at all: status 0 (no network), or the service
 * worker's own 504 with no problem body (it answers so when its fetch of a request it does not keep fails).
 */
export function isNoAnswer(error: unknown): boolean {
  if (!(error instanceof HttpErrorResponse)) return false;
  if (error.status === 0) return true;
  if (error.status !== 504) return false;
  const body: unknown = error.error;
  return body === null || body === undefined || body === '' || typeof body !== 'object';
}

/** How often the device asks the server whether it is back, while it believes it is offline. */
export const PROBE_INTERVAL_MS = 15_000;

/** Asks the server whether it answers (GET /api/health); true when it does. Replaceable in specs. */
export const HEALTH_PROBE = new InjectionToken<() => Promise<boolean>>('HEALTH_PROBE', {
  providedIn: 'root',
  factory: () => async () => {
    try {
      const answer = await fetch('/api/health', { cache: 'no-store', credentials: 'omit' });
      return answer.ok;
    } catch {
      return false;
    }
  },
});

/** The browser's own view of the network, when there is a browser. */
function browserSaysOnline(): boolean {
  return typeof navigator === 'undefined' ? true : navigator.onLine;
}

/**
 * Whether the server can be reached now. The browser's `online`/`offline` events are heard, every request
 * that gets no answer at all (status 0) says offline, every answer says online, and while offline the server's
 * health is asked every 15 s (a browser may say "online" on a network that reaches nothing).
 */
@Injectable({ providedIn: 'root' })
export class Connection {
  private readonly probe = inject(HEALTH_PROBE);
  private readonly state = signal(browserSaysOnline());
  private timer: ReturnType<typeof setInterval> | null = null;
  private probing = false;

  /** True when the server was reached last (or nothing says otherwise). */
  readonly online = this.state.asReadonly();

  constructor() {
    if (typeof window !== 'undefined') {
      const goneOffline = () => this.reportNoAnswer();
      const backOnline = () => void this.check();
      window.addEventListener('offline', goneOffline);
      window.addEventListener('online', backOnline);
      inject(DestroyRef).onDestroy(() => {
        window.removeEventListener('offline', goneOffline);
        window.removeEventListener('online', backOnline);
        this.stopProbing();
      });
    }
    if (!this.state()) this.startProbing();
  }

  /** A request got no answer at all: the device is offline until an answer or a probe says otherwise. */
  reportNoAnswer(): void {
    this.state.set(false);
    this.startProbing();
  }

  /** The server answered (whatever it said): the device is online. */
  reportAnswer(): void {
    if (!browserSaysOnline()) return;
    this.state.set(true);
    this.stopProbing();
  }

  /** Asks the server now; resolves with whether it answered. */
  async check(): Promise<boolean> {
    if (this.probing) return this.state();
    this.probing = true;
    try {
      const answered = browserSaysOnline() && (await this.probe());
      if (answered) this.reportAnswer();
      else this.reportNoAnswer();
      return answered;
    } finally {
      this.probing = false;
    }
  }

  private startProbing(): void {
    this.timer ??= setInterval(() => void this.check(), PROBE_INTERVAL_MS);
  }

  private stopProbing(): void {
    if (this.timer !== null) clearInterval(this.timer);
    this.timer = null;
  }
}
