import { HttpClient } from '@angular/common/http';
import { computed, Injectable, inject, signal } from '@angular/core';
import type { Permission, Session, User } from '@counterpoise/api';
import { catchError, finalize, firstValueFrom, map, type Observable, of, shareReplay, tap } from 'rxjs';
import type { AcceptInvitation } from './api-types';

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
  readonly accessToken: string;
}

/**
 * The signed-in person, held in memory only. The access token never reaches localStorage or any other
 * storage a script could read later; what survives a reload is the server's httpOnly refresh cookie, which
 * `restore()` trades for a new token once at start.
 */
@Injectable({ providedIn: 'root' })
export class AuthSession {
  private readonly http = inject(HttpClient);
  private readonly current = signal<SignedIn | null>(null);
  private readonly restoredState = signal(false);
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
        catchError(() => of(undefined)),
      ),
    ).finally(() => this.restoredState.set(true));
    return this.restoring;
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

  /** Takes up a session the server has just issued. */
  start(session: Session): void {
    this.current.set({
      user: session.user,
      permissions: session.permissions,
      accessToken: session.accessToken,
    });
  }

  /** Replaces the person and permissions with fresher ones (`GET /api/v1/me`), keeping the token. */
  update(user: User, permissions: readonly Permission[]): void {
    this.current.update((signedIn) => (signedIn ? { ...signedIn, user, permissions } : null));
  }

  /** Forgets the session here, for instance once the server has refused to refresh it. */
  clear(): void {
    this.current.set(null);
  }
}
