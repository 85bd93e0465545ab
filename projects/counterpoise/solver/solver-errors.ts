import type { FieldError, Problem } from '@counterpoise/ng/api';
import { BalanceSolverError } from './balance-solver-error';

/** What the remote solver knows of a failed request, without Angular's types. */
export interface FailedResponse {
  /** The HTTP status; 0 when no answer came (offline, refused, blocked by CORS). */
  readonly status: number;
  /** The problem the service answered with, when its body was one (see `readProblem`). */
  readonly problem?: Problem;
  /** The `Retry-After` header, when there was one. */
  readonly retryAfter?: string | null;
}

/**
 * Seconds to wait from a `Retry-After` header: a number of seconds, or an HTTP date (RFC 9110 §10.2.3).
 * Undefined when the header is absent or cannot be read.
 */
export function parseRetryAfter(
  value: string | null | undefined,
  now: Date = new Date(),
): number | undefined {
  if (value === null || value === undefined || value.trim() === '') return undefined;
  const text = value.trim();
  if (/^\d+$/.test(text)) return Number(text);
  const at = Date.parse(text);
  if (Number.isNaN(at)) return undefined;
  return Math.max(0, Math.ceil((at - now.getTime()) / 1000));
}

/**
 * The body as a problem, when it is one: the fields the solvers read (`type`, `title`, `status`, and the
 * optional `detail`, `instance`, `code` and `errors`), checked by hand. A small type guard rather than the
 * API's `ProblemSchema`, so that an error answer needs nothing of the API runtime (zod, the schemas). A
 * body that is not a problem gives undefined, and the status alone speaks.
 */
export function readProblem(body: unknown): Problem | undefined {
  if (body === null || typeof body !== 'object' || Array.isArray(body)) return undefined;
  const fields = body as Record<string, unknown>;
  const { type, title, status, detail, instance, code, errors } = fields;
  if (typeof type !== 'string' || typeof title !== 'string' || !Number.isInteger(status)) return undefined;
  const optionalText = (value: unknown) => value === undefined || typeof value === 'string';
  if (!optionalText(detail) || !optionalText(instance) || !optionalText(code)) return undefined;
  if (errors !== undefined && !(Array.isArray(errors) && errors.every(isFieldError))) return undefined;
  return {
    type,
    title,
    status: status as number,
    ...(detail === undefined ? {} : { detail: detail as string }),
    ...(instance === undefined ? {} : { instance: instance as string }),
    ...(code === undefined ? {} : { code: code as string }),
    ...(errors === undefined
      ? {}
      : { errors: (errors as FieldError[]).map(({ path, message }) => ({ path, message })) }),
  };
}

function isFieldError(value: unknown): value is FieldError {
  if (value === null || typeof value !== 'object') return false;
  const { path, message } = value as Record<string, unknown>;
  return typeof path === 'string' && typeof message === 'string';
}

function waitText(seconds: number | undefined): string {
  if (seconds === undefined) return 'Try again in a minute';
  if (seconds <= 1) return 'Try again in a moment';
  if (seconds < 120) return `Try again in ${seconds} seconds`;
  return `Try again in ${Math.ceil(seconds / 60)} minutes`;
}

/**
 * The error a technician sees for a failed request to the calculator API. The status decides the reason;
 * the problem's detail, when the service sent one, says what exactly.
 */
export function solverErrorFromResponse(
  response: FailedResponse,
  now: Date = new Date(),
): BalanceSolverError {
  const { status, problem } = response;
  const details = { status, ...(problem === undefined ? {} : { problem }) };

  if (status === 0) {
    return new BalanceSolverError(
      'unreachable',
      'The calculation service could not be reached. Check the connection, or compute on this device.',
      details,
    );
  }
  if (status >= 200 && status < 300) {
    return new BalanceSolverError(
      'unreachable',
      'The answer did not come from the calculation service (perhaps a sign-in page of the network). ' +
        'Check the connection, or compute on this device.',
      details,
    );
  }
  if (status === 400 || status === 413 || status === 422) {
    const what =
      status === 413 ? 'The request is too large for the calculation service.' : invalidMessage(problem);
    return new BalanceSolverError('invalid', what, details);
  }
  if (status === 401 && problem?.code === 'TOKEN_EXPIRED') {
    return new BalanceSolverError(
      'unauthorized',
      'The portal’s pass to the calculation service has expired. Reload the page to get a new one.',
      details,
    );
  }
  if (status === 401) {
    return new BalanceSolverError(
      'unauthorized',
      'The calculation service did not accept the sign-in or the API key of this portal. Sign in again, ' +
        'or ask the portal administrator to check the key.',
      details,
    );
  }
  if (status === 403 && problem?.code === 'API_KEY_ORIGIN_REFUSED') {
    return new BalanceSolverError(
      'origin-refused',
      'The calculation service does not accept this portal’s API key from this page’s address. Ask the ' +
        'portal administrator to add the address to the key’s web origins.',
      details,
    );
  }
  if (status === 403) {
    return new BalanceSolverError(
      'revoked',
      'The API key of this portal has been withdrawn. Ask the portal administrator for a new key.',
      details,
    );
  }
  if (status === 429) {
    const retryAfterSeconds = parseRetryAfter(response.retryAfter, now);
    return new BalanceSolverError(
      'rate-limited',
      `Too many calculations for this portal's key in the last minute. ${waitText(retryAfterSeconds)}, or compute on this device.`,
      { ...details, ...(retryAfterSeconds === undefined ? {} : { retryAfterSeconds }) },
    );
  }
  if (status === 404 || status === 405 || status === 415) {
    return new BalanceSolverError(
      'server',
      `The calculation service refused the request (status ${status}); the portal's API address or version ` +
        'may be wrong. Tell the portal administrator, and compute on this device meanwhile.',
      details,
    );
  }
  if (status === 502 || status === 503 || status === 504) {
    return new BalanceSolverError(
      'unreachable',
      `The calculation service is not answering (status ${status}). Try again later, or compute on this device.`,
      details,
    );
  }
  return new BalanceSolverError(
    'server',
    `The calculation service failed (status ${status}). Try again later, or compute on this device.`,
    details,
  );
}

/** The error of a calculation the engine refused on the device: the values are at fault, never the service. */
export function solverErrorFromProblem(problem: Problem): BalanceSolverError {
  return new BalanceSolverError('invalid', invalidMessage(problem), { problem, status: problem.status });
}

/**
 * What to tell the technician about values the engine refused: the one field's own message (its path is
 * for programs), a count when several fields are at fault, else the problem's detail.
 */
function invalidMessage(problem: Problem | undefined): string {
  const errors = problem?.errors ?? [];
  if (errors.length > 1) return `${errors.length} values cannot be used; check the marked fields.`;
  return errors[0]?.message ?? problem?.detail ?? 'Some values cannot be used; check them and try again.';
}
