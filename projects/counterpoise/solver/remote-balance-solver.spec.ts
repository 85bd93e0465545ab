import { provideHttpClient } from '@angular/common/http';
import {
  HttpTestingController,
  provideHttpClientTesting,
  type TestRequest,
} from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom, type Observable } from 'rxjs';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { API_KEY_HEADER, CALC_ROUTES, calculate, type CalcRequest } from '@counterpoise/api';
import { BALANCE_SOLVER, type BalanceSolverOutcome } from './balance-solver';
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

/** The one request to `url`, once the solver has sent it. */
function sent(http: HttpTestingController, url: string): Promise<TestRequest> {
  return vi.waitFor(() => http.expectOne(url));
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
    const call = await sent(http, URL);
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
    (await sent(http, URL)).flush(result);
    await first;
    token = 'renewed-token';
    const second = settle(solver.calculate('single-plane', request));
    const call = await sent(http, URL);
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
    (await sent(http, URL)).flush(problem, {
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
    (await sent(http, URL)).flush(problem, { status: 400, statusText: 'Bad Request' });
    const error = (await outcome) as BalanceSolverError;
    expect(error.reason).toBe('invalid');
    expect(error.problem?.errors).toEqual(problem.errors);
    expect(error.message).toBe('The phase must lie within ±3600 degrees.');
  });

  it('says when to try again after a 429', async () => {
    const { solver, http } = setUp();
    const outcome = settle(solver.calculate('single-plane', request));
    (await sent(http, URL)).flush(
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
    (await sent(http, URL)).error(new ProgressEvent('error'), { status: 0, statusText: 'Unknown Error' });
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
    const call = await sent(http, URL);
    await vi.advanceTimersByTimeAsync(5001);
    expect(call.cancelled).toBe(true);
    const error = (await outcome) as BalanceSolverError;
    expect(error.reason).toBe('unreachable');
    expect(error.message).toContain('did not answer in time');
  });

  it('takes an answer that is no JSON object, such as a network sign-in page, for no answer', async () => {
    const { solver, http } = setUp();
    const outcome = settle(solver.calculate('single-plane', request));
    (await sent(http, URL)).flush('<html><body>Sign in to the hotspot</body></html>');
    const error = (await outcome) as BalanceSolverError;
    expect(error.reason).toBe('unreachable');
    expect(error.status).toBe(200);
    expect(error.message).toContain('did not come from the calculation service');
  });
});

describe('RemoteBalanceSolver.calculateAll', () => {
  const BATCH_URL = 'https://calc.example.net/api/v1/calc/batch';
  const splits: CalcRequest<'split'>[] = [
    { weight: result.correction, positionsDeg: [0, 30, 60, 90, 120, 150, 180, 210, 240, 270, 300, 330] },
    { weight: { mass: 41, angleDeg: 100 }, positionsDeg: [0, 90, 180, 270] },
  ];

  /** The batch answer as the server writes it: each item computed by the same route table. */
  function batchAnswer(bodies: readonly unknown[]) {
    return {
      items: bodies.map((body, index) => {
        const outcome = calculate('split', body);
        return outcome.status === 200
          ? { id: String(index), status: 200, result: outcome.result }
          : { id: String(index), status: outcome.status, problem: outcome.problem };
      }),
    };
  }

  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('sends the requests as one batch request and maps each answer back to its request', async () => {
    const { solver, http } = setUp();
    const outcome = settle(solver.calculateAll!('split', splits));
    const call = await sent(http, BATCH_URL);
    expect(call.request.method).toBe('POST');
    expect(call.request.headers.get('X-Api-Key')).toBe(KEY);
    expect(call.request.body).toEqual({
      items: [
        { id: '0', route: 'split', body: splits[0] },
        { id: '1', route: 'split', body: splits[1] },
      ],
    });
    const answer = batchAnswer(splits);
    call.flush(answer);
    expect(await outcome).toEqual(answer.items.map((item) => ({ ok: true, result: item.result })));
  });

  it("turns an item's problem into that item's BalanceSolverError, the others answered", async () => {
    const { solver, http } = setUp();
    const refused = { weight: { mass: 41, angleDeg: 100 }, positionsDeg: [90] } as CalcRequest<'split'>;
    const outcome = settle(solver.calculateAll!('split', [splits[0]!, refused]));
    const answer = batchAnswer([splits[0], refused]);
    expect(answer.items[1]?.status).toBe(400);
    (await sent(http, BATCH_URL)).flush(answer);
    const [first, second] = (await outcome) as BalanceSolverOutcome<unknown>[];
    expect(first).toEqual({ ok: true, result: answer.items[0]?.result });
    if (second?.ok !== false) throw new Error('The refused item must fail.');
    expect(second.error).toBeInstanceOf(BalanceSolverError);
    expect(second.error.reason).toBe('invalid');
    expect(second.error.status).toBe(400);
    expect(second.error.problem).toEqual(answer.items[1]?.problem);
    expect(second.error.problem?.errors?.[0]?.path).toBe('positionsDeg');
    expect(second.error.message).toBe(answer.items[1]?.problem?.errors?.[0]?.message);
  });

  it('fails whole when the batch itself is refused, as one calculation would', async () => {
    const { solver, http } = setUp();
    const outcome = settle(solver.calculateAll!('split', splits));
    (await sent(http, BATCH_URL)).flush(
      { type: 'about:blank', title: 'Too Many Requests', status: 429, code: 'RATE_LIMITED' },
      { status: 429, statusText: 'Too Many Requests', headers: { 'Retry-After': '30' } },
    );
    const error = (await outcome) as BalanceSolverError;
    expect(error).toBeInstanceOf(BalanceSolverError);
    expect(error.reason).toBe('rate-limited');
    expect(error.retryAfterSeconds).toBe(30);
  });

  it('takes a batch answer without one item per request for an answer from elsewhere', async () => {
    const { solver, http } = setUp();
    const outcome = settle(solver.calculateAll!('split', splits));
    (await sent(http, BATCH_URL)).flush(batchAnswer(splits.slice(0, 1)));
    const error = (await outcome) as BalanceSolverError;
    expect(error.reason).toBe('unreachable');
  });
});
