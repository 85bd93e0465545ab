import { HttpClient, HttpErrorResponse, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { authInterceptor } from './auth.interceptor';
import { AUTH_URLS, AuthSession } from './auth-session';
import { aSession, RouteStandIn } from './testing';

const UNAUTHORIZED = { status: 401, statusText: 'Unauthorized' };
const EXPIRED = { type: 'about:blank', title: 'Unauthorized', status: 401, detail: 'The token has expired.' };

describe('authInterceptor', () => {
  let http: HttpTestingController;
  let client: HttpClient;
  let session: AuthSession;
  let router: Router;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(withInterceptors([authInterceptor])),
        provideHttpClientTesting(),
        provideRouter([{ path: '**', component: RouteStandIn, data: { heading: 'Blank' } }]),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    client = TestBed.inject(HttpClient);
    session = TestBed.inject(AuthSession);
    router = TestBed.inject(Router);
    await router.navigateByUrl('/people?filter=tech');
  });

  afterEach(() => http.verify());

  it('sends the access token with API requests once signed in', () => {
    client.get('/api/v1/people').subscribe();
    expect(http.expectOne('/api/v1/people').request.headers.has('Authorization')).toBe(false);

    session.start(aSession('owner', 'abc'));
    client.get('/api/v1/people').subscribe();
    expect(http.expectOne('/api/v1/people').request.headers.get('Authorization')).toBe('Bearer abc');
  });

  it('keeps the token off the refresh request and off addresses outside the API', () => {
    session.start(aSession('owner', 'abc'));
    session.refresh().subscribe();
    client.get('https://elsewhere.example.com/api/v1/people').subscribe();
    client.get('/favicon.svg', { responseType: 'text' }).subscribe();

    expect(http.expectOne(AUTH_URLS.refresh).request.headers.has('Authorization')).toBe(false);
    expect(
      http.expectOne('https://elsewhere.example.com/api/v1/people').request.headers.has('Authorization'),
    ).toBe(false);
    expect(http.expectOne('/favicon.svg').request.headers.has('Authorization')).toBe(false);
    http.match(() => true).forEach((request) => request.flush(null));
  });

  it('refreshes on a 401 and sends the request once more with the new token', () => {
    session.start(aSession('owner', 'old'));
    let answer: unknown;
    client.get('/api/v1/people').subscribe((body) => (answer = body));

    http.expectOne('/api/v1/people').flush(EXPIRED, UNAUTHORIZED);
    http.expectOne(AUTH_URLS.refresh).flush(aSession('owner', 'new'));
    const retry = http.expectOne('/api/v1/people');
    expect(retry.request.headers.get('Authorization')).toBe('Bearer new');
    retry.flush({ people: [], invitations: [] });

    expect(answer).toEqual({ people: [], invitations: [] });
  });

  it('shares one refresh among requests refused at the same moment', () => {
    session.start(aSession('owner', 'old'));
    const answers: unknown[] = [];
    client.get('/api/v1/people').subscribe((body) => answers.push(body));
    client.get('/api/v1/keys').subscribe((body) => answers.push(body));

    http.expectOne('/api/v1/people').flush(EXPIRED, UNAUTHORIZED);
    http.expectOne('/api/v1/keys').flush(EXPIRED, UNAUTHORIZED);
    // One refresh only: the server rotates the cookie, so a second one would be refused.
    http.expectOne(AUTH_URLS.refresh).flush(aSession('owner', 'new'));

    const retries = http.match((request) => request.headers.get('Authorization') === 'Bearer new');
    expect(retries.map((request) => request.request.url).sort()).toEqual(['/api/v1/keys', '/api/v1/people']);
    retries.forEach((request) => request.flush('ok'));
    expect(answers).toEqual(['ok', 'ok']);
  });

  it('retries with a token renewed meanwhile instead of refreshing again', () => {
    session.start(aSession('owner', 'old'));
    client.get('/api/v1/people').subscribe();
    client.get('/api/v1/keys').subscribe();

    http.expectOne('/api/v1/people').flush(EXPIRED, UNAUTHORIZED);
    http.expectOne(AUTH_URLS.refresh).flush(aSession('owner', 'new'));
    http.expectOne('/api/v1/people').flush('ok');
    // This refusal was of the old token, answered after the refresh had finished.
    http.expectOne('/api/v1/keys').flush(EXPIRED, UNAUTHORIZED);

    http.expectNone(AUTH_URLS.refresh);
    const retry = http.expectOne('/api/v1/keys');
    expect(retry.request.headers.get('Authorization')).toBe('Bearer new');
    retry.flush('ok');
  });

  it('holds a request back while a refresh is under way, then sends it with the new token', () => {
    session.start(aSession('owner', 'old'));
    session.refresh().subscribe();
    client.get('/api/v1/people').subscribe();
    http.expectNone('/api/v1/people');

    http.expectOne(AUTH_URLS.refresh).flush(aSession('owner', 'new'));
    expect(http.expectOne('/api/v1/people').request.headers.get('Authorization')).toBe('Bearer new');
  });

  it('ends the session and asks to sign in, with the way back, when the refresh is refused', async () => {
    session.start(aSession('owner', 'old'));
    let failure: unknown;
    client.get('/api/v1/people').subscribe({ error: (error: unknown) => (failure = error) });

    http.expectOne('/api/v1/people').flush(EXPIRED, UNAUTHORIZED);
    http.expectOne(AUTH_URLS.refresh).flush({ title: 'Unauthorized', status: 401 }, UNAUTHORIZED);
    // The navigation to the sign-in page runs after the current task.
    await new Promise((resolve) => setTimeout(resolve));

    expect(session.signedIn()).toBe(false);
    expect(failure).toBeInstanceOf(HttpErrorResponse);
    expect((failure as HttpErrorResponse).status).toBe(401);
    const url = router.parseUrl(router.url);
    expect(url.root.children['primary']?.segments.map((segment) => segment.path)).toEqual(['sign-in']);
    expect(url.queryParams).toEqual({ returnUrl: '/people?filter=tech', ended: '1' });
  });

  it('passes a second refusal to the caller instead of refreshing in a loop', () => {
    session.start(aSession('owner', 'old'));
    let status = 0;
    client.get('/api/v1/outbox').subscribe({ error: (error: HttpErrorResponse) => (status = error.status) });

    http.expectOne('/api/v1/outbox').flush(EXPIRED, UNAUTHORIZED);
    http.expectOne(AUTH_URLS.refresh).flush(aSession('owner', 'new'));
    http.expectOne('/api/v1/outbox').flush(EXPIRED, UNAUTHORIZED);

    http.expectNone(AUTH_URLS.refresh);
    expect(status).toBe(401);
    expect(session.signedIn()).toBe(true);
  });

  it('takes a 401 of the sign-in itself as wrong credentials, not as an expired token', () => {
    let status = 0;
    client
      .post(AUTH_URLS.signIn, { email: 'marit@example.com', password: 'wrong' })
      .subscribe({ error: (error: HttpErrorResponse) => (status = error.status) });
    http.expectOne(AUTH_URLS.signIn).flush({ title: 'Unauthorized', status: 401 }, UNAUTHORIZED);

    http.expectNone(AUTH_URLS.refresh);
    expect(status).toBe(401);
  });

  it('leaves a 403 to the page: the person is signed in, only not allowed', () => {
    session.start(aSession('technician'));
    let status = 0;
    client.get('/api/v1/people').subscribe({ error: (error: HttpErrorResponse) => (status = error.status) });
    http
      .expectOne('/api/v1/people')
      .flush({ title: 'Forbidden', status: 403 }, { status: 403, statusText: 'Forbidden' });

    http.expectNone(AUTH_URLS.refresh);
    expect(status).toBe(403);
    expect(session.signedIn()).toBe(true);
  });
});
