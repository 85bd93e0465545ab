import { MASKED_SECRET } from '@counterpoise/api';

/** Web addresses in plain text or HTML; the same notion of an address as the Outbox's links. */
const ADDRESS = /\bhttps?:\/\/[^\s<>"']+/gi;

/**
 * A query (or fragment) parameter whose name says it carries a credential (`token=`, `reset_token=`,
 * `key=`, `code=`, `sig=`…), anywhere in the text, so that a link split over two lines or written
 * without its scheme is caught too. The value stops before a sentence's closing punctuation.
 */
const SECRET_PARAMETER =
  /((?:^|[?&;#\s])[\w.-]*(?:token|secret|key|code|sig|signature|password|auth)[\w.-]*=)[\w~%+/=.-]*[\w~%+/=-]/gim;

/** A run of URL-safe characters long enough to be a secret: a path segment, a part of a JWT. */
const LONG_RUN = /[A-Za-z0-9_-]{16,}/g;

/**
 * Whether a run looks random rather than like words: lower case, upper case and digits together
 * (base64, base64url), or two of them in a long run (hexadecimal, or base64 that drew no digit). A slug
 * such as `accept-invitation` is not; a shop's name with a year in it may be, and masking it costs only
 * a word in the Outbox.
 */
function looksRandom(run: string): boolean {
  const kinds = [/[a-z]/, /[A-Z]/, /\d/].filter((kind) => kind.test(run)).length;
  return kinds === 3 || (run.length >= 32 && kinds === 2);
}

/**
 * The text with the secret of every link replaced by `MASKED_SECRET`: the value of any credential-like
 * parameter, and any random-looking run in an address's path, query or fragment (the host is kept, so
 * the Outbox still shows where the link led). What remains shows that a message went out and what it
 * was about, but opens nothing.
 */
export function maskLinkSecrets(text: string): string {
  return text.replace(SECRET_PARAMETER, `$1${MASKED_SECRET}`).replace(ADDRESS, (address) => {
    const pathStart = address.indexOf('/', address.indexOf('//') + 2);
    if (pathStart < 0) return address;
    const rest = address
      .slice(pathStart)
      .replace(LONG_RUN, (run) => (looksRandom(run) ? MASKED_SECRET : run));
    return address.slice(0, pathStart) + rest;
  });
}
