import type { RequestHandler } from 'express';
import { RECORDS_PROBLEM_CODES } from '@counterpoise/api';
import { HttpProblem } from '../http/problem';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      /** The versions the request's `If-Match` names: the change applies only to one of them. */
      ifMatchVersions?: readonly number[];
    }
  }
}

/**
 * The ETag of a record at a version: strong and quoted (`"7"`). The version alone identifies what the
 * client saw, since every change of a record, archiving included, makes a new one.
 */
export function etagOf(version: number): string {
  return `"${version}"`;
}

/** One entity-tag of an `If-Match` list (RFC 9110, 8.8.3): optionally weak, quoted, no spaces or quotes. */
const ENTITY_TAG = /^(W\/)?"([\x21\x23-\x7E\x80-\xFF]*)"$/;

const VERSION_REQUIRED_DETAIL =
  'A change needs the version it was made on: send the ETag of the record (from its GET or last change) ' +
  'in If-Match, so that an edit made meanwhile by someone else is not overwritten.';

/**
 * The versions named by an `If-Match` value, or the problem it has. `*` is refused: it would let a
 * change overwrite whatever someone saved meanwhile, which is what the header is there to prevent.
 * Weak tags are read but never match (If-Match compares strongly), and so lead to a 412 like any other
 * tag of a version that is not the stored one.
 */
export function parseIfMatch(value: string | undefined): { versions: number[] } | { problem: HttpProblem } {
  const trimmed = value?.trim() ?? '';
  if (trimmed === '' || trimmed === '*') {
    return {
      problem: new HttpProblem(
        428,
        'Precondition Required',
        trimmed === '*'
          ? `If-Match: * names no version. ${VERSION_REQUIRED_DETAIL}`
          : VERSION_REQUIRED_DETAIL,
        undefined,
        'about:blank',
        RECORDS_PROBLEM_CODES.versionRequired,
      ),
    };
  }
  const versions: number[] = [];
  for (const part of trimmed.split(',')) {
    const match = ENTITY_TAG.exec(part.trim());
    if (!match) {
      const message = 'Write If-Match as the quoted ETag of the record, such as "3".';
      return {
        problem: new HttpProblem(400, 'Bad Request', `If-Match: ${message}`, [{ path: 'If-Match', message }]),
      };
    }
    const [, weak, tag] = match;
    if (weak === undefined && /^[1-9]\d{0,15}$/.test(tag!)) versions.push(Number(tag));
  }
  return { versions };
}

/**
 * The precondition of every change (PATCH, archive, restore): 428 without `If-Match`, 400 when it is
 * not a list of entity-tags; otherwise the versions it names are kept for the handler. Runs before the
 * body is read, so a client that forgot the header learns it before anything else.
 */
export const requireIfMatch: RequestHandler = (req, res, next) => {
  const parsed = parseIfMatch(req.headers['if-match']);
  if ('problem' in parsed) {
    next(parsed.problem);
    return;
  }
  res.locals.ifMatchVersions = parsed.versions;
  next();
};

/** The versions `requireIfMatch` kept for the request. */
export function ifMatchVersions(locals: { ifMatchVersions?: readonly number[] }): readonly number[] {
  if (locals.ifMatchVersions === undefined) throw new Error('ifMatchVersions runs after requireIfMatch.');
  return locals.ifMatchVersions;
}

/**
 * A change made on a version that is no longer the stored one (412). It carries the record as it is
 * now, so that the screen can show what changed meanwhile and offer to merge or reload.
 */
export class ChangedMeanwhile extends HttpProblem {
  override readonly headers: Readonly<Record<string, string>>;
  override readonly extensions: Readonly<Record<string, unknown>>;

  constructor(
    readonly current: { readonly version: number },
    noun: string,
  ) {
    super(
      412,
      'Precondition Failed',
      `The ${noun} was changed by someone else since you read it (it is now at version ` +
        `${current.version}). Compare with \`current\`, then send your change again with its ETag.`,
      undefined,
      'about:blank',
      RECORDS_PROBLEM_CODES.changedMeanwhile,
    );
    // The stored record and its ETag go with the problem, so that the client can merge or reload.
    this.headers = { ETag: etagOf(current.version) };
    this.extensions = { current };
  }
}

/**
 * Refuses a change unless the stored version is one the client named (412 with the stored record).
 * The write that follows repeats the check in its own statement (`… AND version = ?`).
 */
export function checkVersion<R extends { readonly version: number }>(
  current: R,
  versions: readonly number[],
  noun: string,
): void {
  if (!versions.includes(current.version)) throw new ChangedMeanwhile(current, noun);
}
