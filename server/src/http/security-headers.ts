import type { RequestHandler } from 'express';
import helmet from 'helmet';

/**
 * helmet for the pages: the workbench and Swagger UI. Its defaults, less `upgrade-insecure-requests`:
 * the product is served over plain HTTP on a shop's network, where upgrading would break every asset.
 */
const pageHeaders = helmet({
  contentSecurityPolicy: { directives: { upgradeInsecureRequests: null } },
});

/**
 * helmet for the JSON answers of the API, the headers the OWASP REST Security Cheat Sheet ("Security
 * Headers") lists for every API response: `Cache-Control: no-store`, `Content-Security-Policy:
 * frame-ancestors 'none'` (with `default-src 'none'`: a JSON answer loads nothing), `Strict-Transport-Security`,
 * `X-Content-Type-Options: nosniff` and `X-Frame-Options: DENY`, plus `Cross-Origin-Resource-Policy` and
 * `Referrer-Policy`. The headers meant for HTML documents (DNS prefetch, download options, Flash policies,
 * the old XSS filter, origin-agent clustering, the opener policy) are left off: on a JSON answer they
 * protect nothing and cost bytes on every one of the busiest responses.
 */
const apiHelmet = helmet({
  contentSecurityPolicy: {
    useDefaults: false,
    directives: { defaultSrc: ["'none'"], frameAncestors: ["'none'"] },
  },
  crossOriginOpenerPolicy: false,
  originAgentCluster: false,
  xDnsPrefetchControl: false,
  xDownloadOptions: false,
  xFrameOptions: { action: 'deny' },
  xPermittedCrossDomainPolicies: false,
  xXssProtection: false,
});

const apiHeaders: RequestHandler = (req, res, next) => {
  res.setHeader('Cache-Control', 'no-store');
  apiHelmet(req, res, next);
};

/** Whether a path is one of the API's JSON answers (everything under `/api` but the Swagger UI page). */
export function isJsonApiPath(path: string): boolean {
  return path.startsWith('/api/') && !path.startsWith('/api/docs');
}

/** The security headers of every answer: the API's set on JSON routes, the pages' set elsewhere. */
export function securityHeaders(): RequestHandler {
  return (req, res, next) => (isJsonApiPath(req.path) ? apiHeaders : pageHeaders)(req, res, next);
}
