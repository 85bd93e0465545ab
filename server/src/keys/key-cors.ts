import cors from 'cors';
import type { Request, RequestHandler, Response } from 'express';
import { API_KEY_HEADER } from '@counterpoise/api';
import type { ApiKeyService } from './keys.service';
import type { VisitorTokens } from './visitor-tokens';

const CORS_OPTIONS = {
  methods: ['GET', 'POST'],
  allowedHeaders: [API_KEY_HEADER, 'Authorization', 'Content-Type'],
  exposedHeaders: [
    'RateLimit-Limit',
    'RateLimit-Remaining',
    'RateLimit-Reset',
    'RateLimit-Policy',
    'Retry-After',
  ],
  maxAge: 600,
};

/** Whether a request is a CORS preflight (RFC 9110 OPTIONS with the Fetch standard's request header). */
function isPreflight(req: Request): boolean {
  return req.method === 'OPTIONS' && req.headers['access-control-request-method'] !== undefined;
}

/**
 * CORS of the keyed routes, which follows two lists: the server's (`CORS_ORIGINS`), whose pages may
 * read every answer, as before keys had origins; and each key's own, whose pages may read the answers
 * of that key (and of the visitor tokens bound to their origin).
 *
 * A preflight carries no key, so it is answered for every origin listed by an active key, bound to a
 * live visitor token, or configured. The actual request is answered for its origin when the key (or
 * token) allows it; until the key is checked, an origin that passed the preflight is let read the
 * answer, so that a page can show why its key was refused. Every answer varies by `Origin`.
 */
export class KeyCors {
  private readonly configured: ReadonlySet<string>;
  private readonly forConfigured: RequestHandler;
  private readonly reflect: RequestHandler;

  constructor(
    corsOrigins: readonly string[],
    private readonly keys: ApiKeyService,
    private readonly visitorTokens?: VisitorTokens,
  ) {
    this.configured = new Set(corsOrigins);
    this.forConfigured = cors({ ...CORS_OPTIONS, origin: [...corsOrigins] });
    this.reflect = cors({ ...CORS_OPTIONS, origin: true });
  }

  /** The first middleware of the keyed chain: preflights end here; other requests get provisional CORS. */
  readonly middleware: RequestHandler = (req, res, next) => {
    const origin = req.headers.origin;
    if (origin === undefined) {
      next();
      return;
    }
    if (this.configured.has(origin)) {
      this.forConfigured(req, res, next);
      return;
    }
    if (this.passesPreflight(origin)) {
      this.reflect(req, res, next);
      return;
    }
    res.vary('Origin');
    if (isPreflight(req)) {
      // Refused: the browser stops at the missing Access-Control-Allow-Origin.
      res.status(204).end();
      return;
    }
    next();
  };

  /**
   * Settles CORS once the key (or token) is known: `bound` says whether the key or token limits where it
   * is used from, in which case the request's origin (checked by then) reads the answer; otherwise only
   * a configured origin does, as for any key without origins.
   */
  settle(req: Request, res: Response, bound: boolean): void {
    const origin = req.headers.origin;
    if (origin === undefined || this.configured.has(origin)) return;
    if (bound) {
      res.setHeader('Access-Control-Allow-Origin', origin);
      res.setHeader('Access-Control-Expose-Headers', CORS_OPTIONS.exposedHeaders.join(','));
      res.vary('Origin');
    } else {
      res.removeHeader('Access-Control-Allow-Origin');
      res.removeHeader('Access-Control-Expose-Headers');
    }
  }

  private passesPreflight(origin: string): boolean {
    return this.keys.originsInUse().has(origin) || (this.visitorTokens?.hasLiveOrigin(origin) ?? false);
  }
}
