import { HttpProblem } from '../http/problem';

/** A 429 problem that says how long to wait: it is answered with `Retry-After`, whichever layer refused. */
export class TooManyRequests extends HttpProblem {
  override readonly headers: Readonly<Record<string, string>>;

  constructor(
    detail: string,
    code: string,
    /** Whole seconds before a new attempt can be taken. */
    readonly retryAfterSeconds: number,
  ) {
    super(429, 'Too Many Requests', detail, undefined, 'about:blank', code);
    this.headers = { 'Retry-After': String(retryAfterSeconds) };
  }
}
