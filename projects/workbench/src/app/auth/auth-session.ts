import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { computed, Injectable, inject, signal } from '@angular/core';
import type { Permission, Session, User } from '@counterpoise/api';
import {
  catchError,
  finalize,
  firstValueFrom,
  map,
  type Observable,
  of,
  shareReplay,
  Subject,
  tap,
} from 'rxjs';
import type { AcceptInvitation } from './api-types';
import { afterNextPaint } from '../shell/after-next-paint';

/** The routes of the session itself. */
export const AUTH_URLS = {
  signIn: '/api/v1/auth/sign-in',
  refresh: '/api/v1/auth/refresh',
  signOut: '/api/v1/auth/sign-out',
  passwordReset: '/api/v1/auth/password-reset',
  passwordResetConfirm: '/api/v1/auth/password-reset/confirm',
  me: '/api/v1/me',
} as const;

/** What the workbench keeps of a session: who, what they may do, and the token that proves it. */
interface SignedIn {
  readonly user: User;
  readonly permissions: readonly Permission[];
  /** Null while the session goes on with no connection, from the profile kept on the device. */
  readonly accessToken: string | null;
}

/** Who was signed in on this device, without any token: enough to go on working with no connection. */
export interface KeptProfile {
  readonly user: User;
  readonly permissions: readonly Permission[];
}

/** Where the profile is kept (the browser's localStorage; the specs give a map in its place). */
export type ProfileStorage = Pick<Storage, 'getItem' | 'setItem' | 'removeItem'>;

const PROFILE_KEY = 'counterpoise.profile';

/**
 * Whether a failed refresh met no server at all (no network: status 0; the service worker's 504 with no
 * problem; a gateway that cannot reach the server), rather than a refusal of the session.
 */
function unreachable(error: unknown): boolean {
  if (!(error instanceof HttpErrorResponse)) return false;
  return error.status === 0 || error.status === 502 || error.status === 503 || error.status === 504;
}

function browserProfileStorage(): ProfileStorage | null {
  try {
    return typeof localStorage === 'undefined' ? null : localStorage;
  } catch {
    return null;
  }
}

/**
 * The signed-in person, held in memory only. The access token never reaches localStorage or any other
 * storage a script could read later; what survives a reload is the server's httpOnly refresh cookie, which
 * `restore()` trades for a new token once at start.
 *
 * With no connection the refresh cannot be made: the person's profile (name, role, permissions; never a token)
 * is kept on the device at sign-in, and `restore()` then goes on as that person in an offline state (reads
 * from the device, changes queued) until `reconnect()` refreshes the session. A refresh the server refuses
 * still signs out.
 */
@Injectable({ providedIn: 'root' })
export class AuthSession {
  private readonly http = inject(HttpClient);
  private readonly current = signal<SignedIn | null>(null);
  private readonly restoredState = signal(false);
  private readonly offlineState = signal(false);
  private readonly endedSubject = new Subject<number>();
  private readonly profiles: ProfileStorage | null = browserProfileStorage();
  private inFlightRefresh: Observable<Session> | null = null;
  private restoring: Promise<void> | null = null;

  /** The signed-in person, or null. */
  readonly user = computed(() => this.current()?.user ?? null);
  /** What the signed-in person may do, as the server granted it; empty when signed out. */
  readonly permissions = computed(() => this.current()?.permissions ?? []);
  /** The bearer token of API requests, or null. */
  readonly accessToken = computed(() => this.current()?.accessToken ?? null);
  /** Whether someone is signed in. */
  readonly signedIn = computed(() => this.current() !== null);
  /** False until the first attempt to restore the session has answered, so that pages do not flash. */
  readonly restored = this.restoredState.asReadonly();
  /** True while the session goes on with no connection, from the profile kept on the device (no token). */
  readonly offline = this.offlineState.asReadonly();
  /** The id of each person whose session ends here (signed out, or a refresh refused). */
  readonly ended: Observable<number> = this.endedSubject.asObservable();

  /** Whether the signed-in person holds a permission; false when signed out. */
  can(permission: Permission): boolean {
    return this.permissions().includes(permission);
  }

  /**
   * Resumes the session a refresh cookie still carries, once per page load; later calls wait for the same
   * answer. Never rejects: no cookie simply means signed out.
   */
  restore(): Promise<void> {
    this.restoring ??= firstValueFrom(
      this.refresh().pipe(
        map(() => undefined),
        catchError((error: unknown) => {
          if (unreachable(error)) this.goOnOffline();
          return of(undefined);
        }),
      ),
    ).finally(() => this.restoredState.set(true));
    return this.restoring;
  }

  /**
   * `restore()` for a page that does not wait for its answer. On a device that keeps a profile it starts at
   * once, as the pages of that person need it. On any other device the session is almost surely absent, and
   * the refresh waits until the first page is painted: on a slow link it would otherwise share the first
   * page's round trips and bandwidth, for an answer that is "signed out" in nearly every case.
   */
  restoreInBackground(): Promise<void> {
    if (this.restoring !== null || this.keepsProfile()) return this.restore();
    return afterNextPaint().then(() => this.restore());
  }

  /**
   * Once the connection returns, trades the refresh cookie for a token again if the session went on offline.
   * Resolves true when the session is live (or was already); a refusal signs out (what waits to be sent stays
   * on the device for the same person to send after signing in again).
   */
  async reconnect(): Promise<boolean> {
    if (!this.offlineState()) return this.signedIn();
    try {
      await firstValueFrom(this.refresh());
      return true;
    } catch (error) {
      if (!unreachable(error)) this.clear();
      return false;
    }
  }

  /**
   * Trades the refresh cookie for a new access token. Concurrent callers share one request: the server
   * rotates the cookie on every refresh, so a second request with the old cookie would be refused.
   */
  refresh(): Observable<Session> {
    this.inFlightRefresh ??= this.http.post<Session>(AUTH_URLS.refresh, null).pipe(
      tap((session) => this.start(session)),
      finalize(() => (this.inFlightRefresh = null)),
      shareReplay({ bufferSize: 1, refCount: false }),
    );
    return this.inFlightRefresh;
  }

  /** The refresh under way, if any, so that a request about to leave can wait for the new token. */
  pendingRefresh(): Observable<Session> | null {
    return this.inFlightRefresh;
  }

  /** Signs in with an e-mail address and a password. */
  signIn(email: string, password: string): Observable<Session> {
    return this.http
      .post<Session>(AUTH_URLS.signIn, { email, password })
      .pipe(tap((session) => this.start(session)));
  }

  /** Accepts an invitation, which signs the new person in. */
  acceptInvitation(token: string, body: AcceptInvitation): Observable<Session> {
    return this.http
      .post<Session>(`/api/v1/invitations/${encodeURIComponent(token)}/accept`, body)
      .pipe(tap((session) => this.start(session)));
  }

  /** Revokes the session on the server, then forgets it here. */
  signOut(): Observable<void> {
    return this.http.post<void>(AUTH_URLS.signOut, null).pipe(tap(() => this.clear()));
  }

  /** Takes up a session the server has just issued, and keeps the profile (not the token) on the device. */
  start(session: Session): void {
    this.current.set({
      user: session.user,
      permissions: session.permissions,
      accessToken: session.accessToken,
    });
    this.offlineState.set(false);
    this.keepProfile({ user: session.user, permissions: session.permissions });
  }

  /** Replaces the person and permissions with fresher ones (`GET /api/v1/me`), keeping the token. */
  update(user: User, permissions: readonly Permission[]): void {
    this.current.update((signedIn) => (signedIn ? { ...signedIn, user, permissions } : null));
    this.keepProfile({ user, permissions });
  }

  /** Forgets the session here, for instance once the server has refused to refresh it. */
  clear(): void {
    const userId = this.current()?.user.id;
    this.current.set(null);
    this.offlineState.set(false);
    this.profiles?.removeItem(PROFILE_KEY);
    if (userId !== undefined) this.endedSubject.next(userId);
  }

  /**
   * Whether this device keeps the profile of someone who signed in here and has not signed out. Every
   * session that starts here keeps one (`start`) and signing out removes it, so without one the refresh
   * cookie is almost surely absent too: the sign-in page can draw at once instead of waiting for `restore()`.
   */
  keepsProfile(): boolean {
    try {
      return Boolean(this.profiles?.getItem(PROFILE_KEY));
    } catch {
      return false;
    }
  }

  /** Goes on as the person whose profile the device keeps, with no token, until the connection returns. */
  private goOnOffline(): void {
    const text = this.profiles?.getItem(PROFILE_KEY);
    if (!text) return;
    try {
      const profile = JSON.parse(text) as KeptProfile;
      if (typeof profile.user?.id !== 'number' || !Array.isArray(profile.permissions)) return;
      this.current.set({ user: profile.user, permissions: profile.permissions, accessToken: null });
      this.offlineState.set(true);
    } catch {
      this.profiles?.removeItem(PROFILE_KEY);
    }
  }

  private keepProfile(profile: KeptProfile): void {
    try {
      this.profiles?.setItem(PROFILE_KEY, JSON.stringify(profile));
    } catch {
      // Storage full or refused: the session works, only not with no connection after a reload.
    }
  }
}
