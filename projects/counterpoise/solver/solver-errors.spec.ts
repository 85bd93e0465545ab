import { describe, expect, it } from 'vitest';
import { ProblemSchema } from '@counterpoise/api';
import { canFallBackToLocal } from './balance-solver-error';
import {
  solverErrorFromProblem,
  solverErrorFromResponse,
  parseRetryAfter,
  readProblem,
} from './solver-errors';

const invalidPhase = {
  type: 'about:blank',
  title: 'Bad Request',
  status: 400,
  code: 'INVALID_REQUEST',
  detail: 'initial.phaseDeg: The phase must lie within ±3600 degrees.',
  errors: [{ path: 'initial.phaseDeg', message: 'The phase must lie within ±3600 degrees.' }],
};

describe('parseRetryAfter', () => {
  it('reads seconds and HTTP dates, and nothing else', () => {
    const now = new Date('2026-11-20T10:00:00Z');
    expect(parseRetryAfter('17', now)).toBe(17);
    expect(parseRetryAfter('Fri, 20 Nov 2026 10:00:42 GMT', now)).toBe(42);
    expect(parseRetryAfter('Fri, 20 Nov 2026 09:00:00 GMT', now)).toBe(0);
    expect(parseRetryAfter('soon', now)).toBeUndefined();
    expect(parseRetryAfter(null, now)).toBeUndefined();
    expect(parseRetryAfter('  ', now)).toBeUndefined();
  });
});

describe('solverErrorFromResponse', () => {
  it.each([
    [0, 'unreachable'],
    [200, 'unreachable'],
    [400, 'invalid'],
    [401, 'unauthorized'],
    [403, 'revoked'],
    [404, 'server'],
    [405, 'server'],
    [413, 'invalid'],
    [415, 'server'],
    [429, 'rate-limited'],
    [500, 'server'],
    [503, 'unreachable'],
  ] as const)('turns status %i into the reason %s', (status, reason) => {
    const error = solverErrorFromResponse({ status });
    expect(error.reason).toBe(reason);
    expect(error.status).toBe(status);
    expect(error.message.length).toBeGreaterThan(20);
  });

  it("keeps the service's problem and speaks the field's own message, without its path", () => {
    const error = solverErrorFromResponse({ status: 400, problem: invalidPhase });
    expect(error.problem).toEqual(invalidPhase);
    expect(error.message).toBe('The phase must lie within ±3600 degrees.');
  });

  it('counts the fields when several are at fault', () => {
    const problem = {
      ...invalidPhase,
      errors: [...invalidPhase.errors, { path: 'trialWeight.mass', message: 'Enter the mass as a number.' }],
    };
    expect(solverErrorFromResponse({ status: 400, problem }).message).toBe(
      '2 values cannot be used; check the marked fields.',
    );
  });

  it('says how long to wait when over the rate limit', () => {
    const error = solverErrorFromResponse({ status: 429, retryAfter: '20' });
    expect(error.retryAfterSeconds).toBe(20);
    expect(error.message).toContain('Try again in 20 seconds');
    expect(solverErrorFromResponse({ status: 429, retryAfter: '300' }).message).toContain(
      'Try again in 5 minutes',
    );
  });

  it('reads a problem as the API schema would, and nothing that is not one', () => {
    expect(readProblem(invalidPhase)).toEqual(invalidPhase);
    expect(ProblemSchema.parse(invalidPhase)).toEqual(readProblem(invalidPhase));
    const withExtras = { ...invalidPhase, instance: '/api/v1/calc/split', traceId: 'abc' };
    expect(readProblem(withExtras)).toEqual(ProblemSchema.parse(withExtras));
    const notProblems: unknown[] = [
      '<html>Bad gateway</html>',
      { title: 'no status' },
      { type: 'about:blank', title: 'Bad Request', status: '400' },
      { type: 'about:blank', title: 'Bad Request', status: 400.5 },
      { ...invalidPhase, detail: 42 },
      { ...invalidPhase, code: null },
      { ...invalidPhase, errors: 'initial.phaseDeg' },
      { ...invalidPhase, errors: [{ path: 'initial.phaseDeg' }] },
      [invalidPhase],
      null,
    ];
    for (const body of notProblems) {
      expect(readProblem(body)).toBeUndefined();
      expect(ProblemSchema.safeParse(body).success).toBe(false);
    }
    expect(solverErrorFromResponse({ status: 500 }).problem).toBeUndefined();
  });

  it("tells a key refused from this page's origin, and an expired visitor token, by their codes", () => {
    const refusal = (status: number, code: string) => ({
      type: 'about:blank',
      title: status === 403 ? 'Forbidden' : 'Unauthorized',
      status,
      code,
      detail:
        'The key is limited to https://portal.kettlebrook.test; this request came from https://elsewhere.test.',
    });
    const origin = solverErrorFromResponse({ status: 403, problem: refusal(403, 'API_KEY_ORIGIN_REFUSED') });
    expect(origin.reason).toBe('origin-refused');
    expect(origin.message).toContain('web origins');
    expect(origin.problem?.detail).toContain('https://elsewhere.test');
    expect(canFallBackToLocal(origin)).toBe(false);
    expect(solverErrorFromResponse({ status: 403, problem: refusal(403, 'API_KEY_REVOKED') }).reason).toBe(
      'revoked',
    );
    const expired = solverErrorFromResponse({ status: 401, problem: refusal(401, 'TOKEN_EXPIRED') });
    expect(expired.reason).toBe('unauthorized');
    expect(expired.message).toContain('Reload the page');
  });

  it('offers the device only when the values are not at fault', () => {
    const reasons = [0, 400, 401, 403, 429, 500].map((status) => {
      const error = solverErrorFromResponse({ status });
      return [error.reason, canFallBackToLocal(error)];
    });
    expect(reasons).toEqual([
      ['unreachable', true],
      ['invalid', false],
      ['unauthorized', false],
      ['revoked', false],
      ['rate-limited', true],
      ['server', true],
    ]);
  });
});

describe('solverErrorFromProblem', () => {
  it("is always the values' fault, with the engine's message", () => {
    const error = solverErrorFromProblem({
      type: 'about:blank',
      title: 'Bad Request',
      status: 400,
      code: 'ZERO_TRIAL_EFFECT',
      detail: 'The trial weight changed almost nothing; use a heavier trial weight.',
    });
    expect(error.reason).toBe('invalid');
    expect(error.message).toBe('The trial weight changed almost nothing; use a heavier trial weight.');
  });
});
