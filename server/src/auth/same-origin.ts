import type { IncomingHttpHeaders } from 'node:http';
import type { RequestHandler } from 'express';
import { ACCOUNTS_PROBLEM_CODES } from '@counterpoise/api';
import { HttpProblem } from '../http/problem';

/**
 * Where a request comes from, as the browser tells it: `same` for a page of this server, `cross` for a
 * page of any other site, `unknown` when the request carries neither `Origin` nor `Sec-Fetch-Site`
 * (curl, scripts, old clients: no page of another site can make a browser send such a POST).
 */
export type RequestSite = 'same' | 'cross' | 'unknown';

/**
 * Reads `Sec-Fetch-Site` first: no page can set it, and it is the browser's own verdict, whatever
 * proxies did to `Host` on the way; a sibling site (`same-site`) is another origin, so it is `cross`.
 * Without it, `Origin` decides: the server's own origin is the public address (`PUBLIC_URL`) or the host
 * the request was sent to (its `Host` header), whatever the scheme, so that the check holds behind a
 * proxy that ends TLS.
 */
export function requestSite(headers: IncomingHttpHeaders, publicOrigin: string): RequestSite {
  const fetchSite = headers['sec-fetch-site'];
  if (fetchSite === 'cross-site' || fetchSite === 'same-site') return 'cross';
  if (fetchSite === 'same-origin') return 'same';
  const origin = headers.origin;
  if (origin !== undefined) {
    if (origin === publicOrigin) return 'same';
    let host: string;
    try {
      host = new URL(origin).host;
    } catch {
      // `null` (a sandboxed frame, a redirect from elsewhere) or anything unreadable.
      return 'cross';
    }
    return host !== '' && host === headers.host?.toLowerCase() ? 'same' : 'cross';
  }
  return 'unknown';
}

const refusal = (detail: string) =>
  new HttpProblem(403, 'Forbidden', detail, undefined, 'about:blank', ACCOUNTS_PROBLEM_CODES.crossSite);

/**
 * Refuses a request that a page of another site made the browser send (403, `CROSS_SITE_REQUEST`).
 * The refresh cookie is SameSite=Strict already; this also covers sign-in and the reset routes, which
 * carry no cookie, and browsers that do not honour SameSite.
 */
export function refuseCrossSite(publicUrl: string): RequestHandler {
  const publicOrigin = new URL(publicUrl).origin;
  return (req, _res, next) => {
    if (requestSite(req.headers, publicOrigin) === 'cross') {
      throw refusal('This request came from a page of another site; the workbench alone may send it.');
    }
    next();
  };
}

/**
 * Takes only a request that a page of this server sent: its `Origin` (or `Sec-Fetch-Site`) must say so,
 * and a body, if any, must be JSON (which no form of another site can send). For sign-out, which needs
 * no secret in the body and would otherwise let any page end a session with a plain form. Browsers
 * send `Origin` on every POST made by fetch or XMLHttpRequest, so the workbench passes as it is.
 */
export function requireSameOrigin(publicUrl: string): RequestHandler {
  const publicOrigin = new URL(publicUrl).origin;
  return (req, _res, next) => {
    if (requestSite(req.headers, publicOrigin) !== 'same') {
      throw refusal(
        'Only a page of this server may send this request (with an Origin or Sec-Fetch-Site header saying so).',
      );
    }
    const length = req.headers['content-length'];
    const bodyless =
      req.headers['transfer-encoding'] === undefined && (length === undefined || length === '0');
    if (!bodyless && !req.is('application/json')) {
      throw new HttpProblem(
        415,
        'Unsupported Media Type',
        `This request takes no body, or a JSON one (got ${req.headers['content-type'] ?? 'no Content-Type'}).`,
      );
    }
    next();
  };
}
