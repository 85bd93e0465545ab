import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom, type Observable } from 'rxjs';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { API_KEY_HEADER, CALC_ROUTES, calculate } from '@counterpoise/api';
import { BALANCE_SOLVER } from './balance-solver';
import { BalanceSolverError } from './balance-solver-error';
import type { CounterpoiseConfig } from './counterpoise-config';
import { provideCounterpoise } from './provide-counterpoise';
import { API_KEY_HEADER_NAME, RemoteBalanceSolver } from './remote-balance-solver';

const KEY = 'cpk_AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA';
const URL = 'https://calc.example.net/api/v1/calc/single-plane';
const request = CALC_ROUTES['single-plane'].example;
const answer = calculate('single-plane', request);
if (answer.status !== 200) throw new Error('The single-plane example must compute.');
const result = answer.result;

function setUp(config: Partial<CounterpoiseConfig> = {}) {
  TestBed.configureTestingModule({
    providers: [
      provideHttpClient(),
      provideHttpClientTesting(),
      provideCounterpoise({
        solver: 'remote',
        apiBaseUrl: 'https://calc.example.net/',
        apiKey: KEY,
        ...config,
      }),
    ],
  });
  return { solver: TestBed.inject(BALANCE_SOLVER), http: TestBed.inject(HttpTestingController) };
}

/** Starts a calculation and returns its settled outcome, so that the request can be answered meanwhile. */
function settle<T>(observable: Observable<T>): Promise<T | BalanceSolverError> {
  return firstValueFrom(observable).catch((error: BalanceSolverError) => error);
}

describe('API_KEY_HEADER_NAME', () => {
  it("names the key's header as the API does", () => {
    expect(API_KEY_HEADER_NAME).toBe(API_KEY_HEADER);
  });
});

describe('RemoteBalanceSolver', () => {
  afterEach(() => {
    TestBed.inject(HttpTestingController).verify();
    vi.useRealTimers();
  });

  it('posts the request to the route with the API key and passes the answer on', async () => {
    const { solver, http } = setUp();
    expect(solver).toBeInstanceOf(RemoteBalanceSolver);
    expect(solver.kind).toBe('remote');
    const outcome = settle(solver.calculate('single-plane', request));
    const call = http.expectOne(URL);
    expect(call.request.method).toBe('POST');
    expect(call.request.body).toEqual(request);
    expect(call.request.headers.get('X-Api-Key')).toBe(KEY);
    expect(call.request.headers.has('Authorization')).toBe(false);
    call.flush(result);
    expect(await outcome).toEqual(result);
  });

  it("sends the signed-in user's current token as a bearer token", async () => {
    let token = 'first-token';
    const { solver, http } = setUp({ apiKey: undefined, accessToken: () => token });
    const first = settle(solver.calculate('single-plane', request));
    http.expectOne(URL).flush(result);
    await first;
    token = 'renewed-token';
    const second = settle(solver.calculate('single-plane', request));
    const call = http.expectOne(URL);
    expect(call.request.headers.get('Authorization')).toBe('Bearer renewed-token');
    expect(call.request.headers.has('X-Api-Key')).toBe(false);
    call.flush(result);
    expect(await second).toEqual(result);
  });

  it('sends nothing when the user is signed out, and says so', async () => {
    const { solver } = setUp({ apiKey: undefined, accessToken: () => null });
    const error = (await settle(solver.calculate('single-plane', request))) as BalanceSolverError;
    expect(error.reason).toBe('unauthorized');
    expect(error.message).toContain('signed out');
  });

  it.each([
    [401, 'unauthorized'],
    [403, 'revoked'],
    [404, 'server'],
    [413, 'invalid'],
    [415, 'server'],
    [500, 'server'],
  ] as const)('turns a %i problem into the reason %s', async (status, reason) => {
    const { solver, http } = setUp();
    const outcome = settle(solver.calculate('single-plane', request));
    const problem = { type: 'about:blank', title: 'Refused', status, detail: 'As the service said.' };
    http.expectOne(URL).flush(problem, {
      status,
      statusText: 'Refused',
      headers: { 'Content-Type': 'application/problem+json' },
    });
    const error = (await outcome) as BalanceSolverError;
    expect(error).toBeInstanceOf(BalanceSolverError);
    expect(error.reason).toBe(reason);
    expect(error.status).toBe(status);
    expect(error.problem).toEqual(problem);
  });

  it('keeps the field errors of a 400, for the form to mark', async () => {
    const { solver, http } = setUp();
    const outcome = settle(solver.calculate('single-plane', request));
    const problem = {
      type: 'about:blank',
      title: 'Bad Request',
      status: 400,
      code: 'INVALID_REQUEST',
      detail: 'withTrial.phaseDeg: The phase must lie within ±3600 degrees.',
      errors: [{ path: 'withTrial.phaseDeg', message: 'The phase must lie within ±3600 degrees.' }],
    };
    http.expectOne(URL).flush(problem, { status: 400, statusText: 'Bad Request' });
    const error = (await outcome) as BalanceSolverError;
    expect(error.reason).toBe('invalid');
    expect(error.problem?.errors).toEqual(problem.errors);
    expect(error.message).toBe('The phase must lie within ±3600 degrees.');
  });

  it('says when to try again after a 429', async () => {
    const { solver, http } = setUp();
    const outcome = settle(solver.calculate('single-plane', request));
    http
      .expectOne(URL)
      .flush(
        { type: 'about:blank', title: 'Too Many Requests', status: 429 },
        { status: 429, statusText: 'Too Many Requests', headers: { 'Retry-After': '12' } },
      );
    const error = (await outcome) as BalanceSolverError;
    expect(error.reason).toBe('rate-limited');
    expect(error.retryAfterSeconds).toBe(12);
  });

  it('calls a network failure unreachable, and tells the developer what a blocked request means', async () => {
    const console = vi.spyOn(globalThis.console, 'error').mockImplementation(() => undefined);
    const { solver, http } = setUp();
    const outcome = settle(solver.calculate('single-plane', request));
    http.expectOne(URL).error(new ProgressEvent('error'), { status: 0, statusText: 'Unknown Error' });
    const error = (await outcome) as BalanceSolverError;
    expect(error.reason).toBe('unreachable');
    expect(error.status).toBe(0);
    expect(error.message).not.toContain('CORS');
    expect(console).toHaveBeenCalledTimes(1);
    const hint = String(console.mock.calls[0]?.[0]);
    expect(hint).toContain(URL);
    expect(hint).toContain(location.origin);
    expect(hint).toContain('CORS_ORIGINS');
    console.mockRestore();
  });

  it('gives up after the configured wait', async () => {
    vi.useFakeTimers();
    const { solver, http } = setUp({ timeoutMs: 5000 });
    const outcome = settle(solver.calculate('single-plane', request));
    const call = http.expectOne(URL);
    await vi.advanceTimersByTimeAsync(5001);
    expect(call.cancelled).toBe(true);
    const error = (await outcome) as BalanceSolverError;
    expect(error.reason).toBe('unreachable');
    expect(error.message).toContain('did not answer in time');
  });

  it("refuses an answer that is not the route's, such as a network sign-in page", async () => {
    const { solver, http } = setUp();
    const outcome = settle(solver.calculate('single-plane', request));
    http.expectOne(URL).flush({ page: 'Sign in to the hotspot' });
    const error = (await outcome) as BalanceSolverError;
    expect(error.reason).toBe('server');
  });
});
