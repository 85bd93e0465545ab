/**
 * What the API-key middleware leaves on a request for the handlers after it, and what they hand to the
 * usage log. The calculator routes depend on these shapes only, not on how keys or usage are stored.
 */

/** The API key a request was made with, once it has been checked. */
export interface ApiKeyIdentity {
  readonly id: number;
  readonly name: string;
  /** The short visible start of the key, safe to show and log. */
  readonly prefix: string;
  /** Calculations per minute this key may make (a batch of n counts n). */
  readonly limitPerMinute: number;
}

/** One row of the usage log: one keyed request, or one item of a batch. */
export interface UsageRow {
  readonly keyId: number;
  /** The route as documented, e.g. `POST /api/v1/calc/single-plane`; a batch item names its own route. */
  readonly route: string;
  readonly status: number;
  readonly durationMs: number;
  /** Bytes of the response body (for a batch item, of its own result or problem). */
  readonly bytes: number;
  readonly at: Date;
  /** True for an item of a batch, whose request (`POST /api/v1/calc/batch`) has a row of its own. */
  readonly batchItem?: boolean;
}

/** Where usage rows go; recording never blocks the response. */
export interface UsageSink {
  record(row: UsageRow): void;
}

declare global {
  // Express types `res.locals` through this interface.
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      /** Set by the API-key middleware on every request it lets through. */
      apiKey?: ApiKeyIdentity;
      /** Set by a handler that logged its own usage rows instead of the request's one. */
      usageRecorded?: boolean;
    }
  }
}
