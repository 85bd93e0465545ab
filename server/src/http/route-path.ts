/**
 * A request path in the one spelling that decisions and logs go by. Express routes without regard to
 * case or a trailing slash, so `/API/v1/Usage/` reaches the same handler as `/api/v1/usage`; anything
 * that chooses by path (which security headers to send, which route a usage row names) must read the
 * path the same way, or a request could reach a route while being treated as another. Runs of slashes
 * are made one as well: a path is then never taken for something other than what it spells out.
 * Expects the path without its query.
 */
export function normaliseRoutePath(path: string): string {
  let normal = path.toLowerCase();
  if (normal.includes('//')) normal = normal.replace(/\/{2,}/g, '/');
  if (normal.length > 1 && normal.endsWith('/')) normal = normal.slice(0, -1);
  return normal;
}

/**
 * What a usage row names a request to no documented route: its method and one fixed label. A key that
 * calls made-up paths then adds rows, never new strings, to the usage table. The method comes from the
 * small set Node's HTTP parser accepts, so the labels are few.
 */
export function unknownRouteLabel(method: string): string {
  return `${method} (unknown route)`;
}
