import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AUTH_URLS, AuthSession } from './auth-session';
import { aSession, aUser } from './testing';
import { afterNextPaint } from '../shell/after-next-paint';

describe('AuthSession', () => {
  let http: HttpTestingController;
  let session: AuthSession;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    session = TestBed.inject(AuthSession);
    localStorage.clear();
    sessionStorage.clear();
  });

  afterEach(() => http.verify());

  it('restores the session from the refresh cookie once, however often it is asked', async () => {
    const first = session.restore();
    const second = session.restore();
    expect(session.restored()).toBe(false);
    const refresh = http.expectOne(AUTH_URLS.refresh);
    expect(refresh.request.method).toBe('POST');
    refresh.flush(aSession('technician'));
    await Promise.all([first, second]);

    expect(session.restored()).toBe(true);
    expect(session.user()?.name).toBe('Suvi Achterberg');
    expect(session.accessToken()).toBe('token-of-technician');
    await session.restore();
    http.expectNone(AUTH_URLS.refresh);
  });

  it('counts as signed out, without an error, when there is no cookie to restore', async () => {
    const restoring = session.restore();
    http
      .expectOne(AUTH_URLS.refresh)
      .flush({ title: 'Unauthorized', status: 401 }, { status: 401, statusText: 'Unauthorized' });
    await expect(restoring).resolves.toBeUndefined();
    expect(session.restored()).toBe(true);
    expect(session.signedIn()).toBe(false);
    expect(session.user()).toBeNull();
  });

  it('leaves the refresh until the first page is painted on a device that keeps no profile', async () => {
    const restoring = session.restoreInBackground();
    http.expectNone(AUTH_URLS.refresh);
    await afterNextPaint();
    http.expectOne(AUTH_URLS.refresh).flush(null, { status: 401, statusText: 'Unauthorized' });
    await restoring;
    expect(session.restored()).toBe(true);
    expect(session.signedIn()).toBe(false);
  });

  it('refreshes at once in the background on a device that keeps a profile, as its pages need the session', async () => {
    session.start(aSession('technician'));
    const reloaded = TestBed.runInInjectionContext(() => new AuthSession());
    const restoring = reloaded.restoreInBackground();
    http.expectOne(AUTH_URLS.refresh).flush(aSession('technician'));
    await restoring;
    expect(reloaded.user()?.name).toBe('Suvi Achterberg');
  });

  it('answers can() from the permissions the server granted', () => {
    expect(session.can('people:read')).toBe(false);
    session.start(aSession('manager'));
    expect(session.can('people:read')).toBe(true);
    expect(session.can('people:invite')).toBe(true);
    expect(session.can('keys:manage')).toBe(false);
  });

  it('signs in with the e-mail address and password and keeps the token in memory only', () => {
    let answered = false;
    session.signIn('marit@example.com', 'correct horse battery staple').subscribe(() => (answered = true));
    const request = http.expectOne(AUTH_URLS.signIn);
    expect(request.request.body).toEqual({
      email: 'marit@example.com',
      password: 'correct horse battery staple',
    });
    request.flush(aSession('owner'));

    expect(answered).toBe(true);
    expect(session.signedIn()).toBe(true);
    expect(session.accessToken()).toBe('token-of-owner');
    // Only the profile (who, with what permissions) is kept, for working with no connection: never the token.
    expect(localStorage.length).toBe(1);
    expect(JSON.stringify({ ...localStorage })).not.toContain('token-of-owner');
    expect(sessionStorage.length).toBe(0);
  });

  it('shares one refresh among every caller while it is under way', () => {
    const tokens: string[] = [];
    session.refresh().subscribe((fresh) => tokens.push(fresh.accessToken));
    session.refresh().subscribe((fresh) => tokens.push(fresh.accessToken));
    expect(session.pendingRefresh()).not.toBeNull();
    http.expectOne(AUTH_URLS.refresh).flush(aSession('owner', 'renewed'));

    expect(tokens).toEqual(['renewed', 'renewed']);
    expect(session.pendingRefresh()).toBeNull();
    // Once answered, the next refresh is a new request.
    session.refresh().subscribe();
    http.expectOne(AUTH_URLS.refresh).flush(aSession('owner', 'renewed again'));
    expect(session.accessToken()).toBe('renewed again');
  });

  it('forgets the session once the server has revoked it on sign-out', () => {
    session.start(aSession('owner'));
    session.signOut().subscribe();
    http.expectOne(AUTH_URLS.signOut).flush(null, { status: 204, statusText: 'No Content' });
    expect(session.signedIn()).toBe(false);
    expect(session.accessToken()).toBeNull();
    expect(session.permissions()).toEqual([]);
  });

  it('keeps the session when the server could not be told of the sign-out', () => {
    session.start(aSession('owner'));
    let failed = false;
    session.signOut().subscribe({ error: () => (failed = true) });
    http.expectOne(AUTH_URLS.signOut).error(new ProgressEvent('error'));
    expect(failed).toBe(true);
    expect(session.signedIn()).toBe(true);
  });

  it('takes fresher details of the person without touching the token', () => {
    session.start(aSession('technician'));
    session.update(aUser('technician', { role: 'manager' }), ['people:read']);
    expect(session.user()?.role).toBe('manager');
    expect(session.can('people:read')).toBe(true);
    expect(session.can('jobs:write')).toBe(false);
    expect(session.accessToken()).toBe('token-of-technician');
  });

  describe('with no connection', () => {
    it('goes on offline as the person last signed in on the device, without a token', async () => {
      session.start(aSession('technician'));
      const reloaded = TestBed.runInInjectionContext(() => new AuthSession());
      const restoring = reloaded.restore();
      http.expectOne(AUTH_URLS.refresh).error(new ProgressEvent('error'));
      await restoring;
      expect(reloaded.signedIn()).toBe(true);
      expect(reloaded.offline()).toBe(true);
      expect(reloaded.user()?.name).toBe('Suvi Achterberg');
      expect(reloaded.can('jobs:write')).toBe(true);
      expect(reloaded.accessToken()).toBeNull();
    });

    it('stays signed out offline when nobody was signed in on the device', async () => {
      const restoring = session.restore();
      http.expectOne(AUTH_URLS.refresh).error(new ProgressEvent('error'));
      await restoring;
      expect(session.signedIn()).toBe(false);
      expect(session.offline()).toBe(false);
    });

    it('refreshes the session once the connection returns', async () => {
      session.start(aSession('technician'));
      const reloaded = TestBed.runInInjectionContext(() => new AuthSession());
      const restoring = reloaded.restore();
      http.expectOne(AUTH_URLS.refresh).flush(null, { status: 504, statusText: 'Gateway Timeout' });
      await restoring;
      expect(reloaded.offline()).toBe(true);

      const reconnecting = reloaded.reconnect();
      http.expectOne(AUTH_URLS.refresh).flush(aSession('technician'));
      await expect(reconnecting).resolves.toBe(true);
      expect(reloaded.offline()).toBe(false);
      expect(reloaded.accessToken()).toBe('token-of-technician');
    });

    it('signs out when the server refuses the refresh, and tells who, so the device forgets their records', async () => {
      session.start(aSession('technician'));
      const reloaded = TestBed.runInInjectionContext(() => new AuthSession());
      const ended: number[] = [];
      reloaded.ended.subscribe((userId) => ended.push(userId));
      const restoring = reloaded.restore();
      http.expectOne(AUTH_URLS.refresh).error(new ProgressEvent('error'));
      await restoring;

      const reconnecting = reloaded.reconnect();
      http
        .expectOne(AUTH_URLS.refresh)
        .flush({ title: 'Unauthorized', status: 401 }, { status: 401, statusText: 'Unauthorized' });
      await expect(reconnecting).resolves.toBe(false);
      expect(reloaded.signedIn()).toBe(false);
      expect(ended).toEqual([aSession('technician').user.id]);
      expect(localStorage.length).toBe(0);
    });

    it('stays offline, still signed in, when the connection fails again on reconnecting', async () => {
      session.start(aSession('technician'));
      const reloaded = TestBed.runInInjectionContext(() => new AuthSession());
      const restoring = reloaded.restore();
      http.expectOne(AUTH_URLS.refresh).error(new ProgressEvent('error'));
      await restoring;
      const reconnecting = reloaded.reconnect();
      http.expectOne(AUTH_URLS.refresh).error(new ProgressEvent('error'));
      await expect(reconnecting).resolves.toBe(false);
      expect(reloaded.signedIn()).toBe(true);
      expect(reloaded.offline()).toBe(true);
    });
  });
});
