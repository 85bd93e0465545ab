import type { RequestHandler } from 'express';
import helmet from 'helmet';
import { normaliseRoutePath } from './route-path';

/**
 * helmet for the pages: the workbench and Swagger UI. Its defaults, less `upgrade-insecure-requests`:
 * the product is served over plain HTTP on a shop's network, where upgrading would break every asset.
 * Images may also come from `blob:` URLs: the workbench fetches photos with the session's access token and
 * shows them as object URLs of its own document. `Strict-Transport-Security` is added apart, and only over
 * HTTPS (see `securityHeaders`).
 */
const pageHeaders = helmet({
  contentSecurityPolicy: {
    directives: { upgradeInsecureRequests: null, imgSrc: ["'self'", 'data:', 'blob:'] },
  },
  strictTransportSecurity: false,
});

/**
 * helmet for the JSON answers of the API, the headers the OWASP REST Security Cheat Sheet ("Security
 * Headers") lists for every API response: `Cache-Control: no-store`, `Content-Security-Policy:
 * frame-ancestors 'none'` (with `default-src 'none'`: a JSON answer loads nothing), `Strict-Transport-Security`
 * (over HTTPS, see `securityHeaders`), `X-Content-Type-Options: nosniff` and `X-Frame-Options: DENY`, plus
 * `Cross-Origin-Resource-Policy` and `Referrer-Policy`. The headers meant for HTML documents (DNS prefetch,
 * download options, Flash policies, the old XSS filter, origin-agent clustering, the opener policy) are left
 * off: on a JSON answer they protect nothing and cost bytes on every one of the busiest responses.
 */
const apiHelmet = helmet({
  contentSecurityPolicy: {
    useDefaults: false,
    directives: { defaultSrc: ["'none'"], frameAncestors: ["'none'"] },
  },
  crossOriginOpenerPolicy: false,
  originAgentCluster: false,
  strictTransportSecurity: false,
  xDnsPrefetchControl: false,
  xDownloadOptions: false,
  xFrameOptions: { action: 'deny' },
  xPermittedCrossDomainPolicies: false,
  xXssProtection: false,
});

/**
 * The headers `apiHelmet` sets, read from it once: they depend on nothing of the request (no nonce, no
 * per-request directive), so every JSON answer gets the same list, set in one loop, where running helmet
 * would build and walk its middleware on each of the busiest answers. helmet stays the source of truth.
 */
function headersSetBy(middleware: RequestHandler): readonly (readonly [string, string])[] {
  const headers: [string, string][] = [];
  const recorder = {
    setHeader: (name: string, value: string) => headers.push([name, value]),
    // helmet removes X-Powered-By, which the app never sends (`app.disable('x-powered-by')`).
    removeHeader: () => undefined,
  };
  let done = false;
  middleware({} as Parameters<RequestHandler>[0], recorder as never, () => {
    done = true;
  });
  if (!done) throw new Error('helmet did not set its headers at once.');
  return headers;
}

const API_HEADERS = [['Cache-Control', 'no-store'] as const, ...headersSetBy(apiHelmet)];

const apiHeaders: RequestHandler = (_req, res, next) => {
  for (const [name, value] of API_HEADERS) res.setHeader(name, value);
  next();
};

/** helmet's own `Strict-Transport-Security` (a year, subdomains included), for answers over HTTPS. */
const hsts = helmet.strictTransportSecurity();

/**
 * Whether a path is one of the API's JSON answers (everything under `/api` but the Swagger UI page).
 * The path is read as Express routes it (`normaliseRoutePath`): `/API/v1/usage` reaches the API, so it
 * gets the API's headers.
 */
export function isJsonApiPath(path: string): boolean {
  const normal = normaliseRoutePath(path);
  return normal.startsWith('/api/') && !normal.startsWith('/api/docs');
}

/** How the server is reached, for the headers that depend on it. */
export interface SecurityHeaderOptions {
  /**
   * Every request reaches the server over HTTPS, through a proxy that ends TLS in front of it (what
   * `COOKIE_SECURE` says): send `Strict-Transport-Security` on every answer. Without it, the header goes
   * only on answers to requests that came over HTTPS themselves (`req.secure`): over plain HTTP a browser
   * ignores it (RFC 6797, 8.1), and the product is often served over plain HTTP on a shop's network.
   */
  readonly secureTransport?: boolean;
}

/**
 * The security headers of every answer: the API's set on JSON routes, the pages' set elsewhere, and
 * `Strict-Transport-Security` over HTTPS only.
 */
export function securityHeaders(options: SecurityHeaderOptions = {}): RequestHandler {
  const always = options.secureTransport === true;
  return (req, res, next) => {
    const headers = isJsonApiPath(req.path) ? apiHeaders : pageHeaders;
    if (always || req.secure) hsts(req, res, () => headers(req, res, next));
    else headers(req, res, next);
  };
}
