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

/** One row of the usage log: one keyed request, with the calculations it carried. */
export interface UsageRow {
  readonly keyId: number;
  /** The route as documented, e.g. `POST /api/v1/calc/single-plane`. */
  readonly route: string;
  readonly status: number;
  readonly durationMs: number;
  /** Bytes of the response body. */
  readonly bytes: number;
  readonly at: Date;
  /**
   * Calculations the request carried, as the key's limit counts them: 1 for a call of a calculator
   * route (refused or not), n for a batch of n items it answered, 0 for anything else.
   */
  readonly calculations: number;
  /** A batch's items answered with an error, counted by status (`{ "400": 2 }`); absent when none. */
  readonly itemErrors?: Readonly<Record<string, number>>;
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
      /**
       * Set by the batch route once it has answered its items: the calculations its request carried and
       * the items' errors, for the request's usage row.
       */
      batchUsage?: { readonly calculations: number; readonly itemErrors?: Record<string, number> };
    }
  }
}
