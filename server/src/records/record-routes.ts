import type { ResponseConfig } from '@asteasolutions/zod-to-openapi';
import { PROBLEM_MEDIA_TYPE, type RecordHistory, RecordHistorySchema } from '@counterpoise/api';
import type { Response } from 'express';
import * as z from 'zod';
import { IdParamSchema } from '../http/params';
import type { RouteDeclaration, RouteTable } from '../http/route';
import type { Actor } from './change-log';
import { etagOf, ifMatchVersions, requireIfMatch } from './versions';

/** Where the records' routes are mounted: the signed-in `/api/v1` router. */
export const RECORDS_BASE_PATH = '/api/v1';

/**
 * Who may call a record route, by what it does: read (list, get, history), write (create, change)
 * and archive (archive, restore). The app maps each to a permission of the feature.
 */
export type RecordAccess = 'read' | 'write' | 'archive';

/** What a record's routes ask of its feature's service. */
export interface RecordRoutesService<Rec, Page, Create, Update, Query> {
  list(actor: Actor, query: Query): Page;
  get(actor: Actor, id: number): Rec;
  create(actor: Actor, fields: Create): Rec;
  update(actor: Actor, id: number, versions: readonly number[], change: Update): Rec;
  archive(actor: Actor, id: number, versions: readonly number[]): Rec;
  restore(actor: Actor, id: number, versions: readonly number[]): Rec;
  history(actor: Actor, id: number): RecordHistory;
}

/**
 * One kind of record's routes: the same seven for customers, machine families and machines, so that
 * versions, archiving and the history work alike everywhere. The examples are invented demo data; a
 * spec parses each with its schema.
 */
export interface RecordRoutesSpec<
  Rec extends { readonly id: number; readonly version: number },
  Page,
  Create,
  Update,
  Query,
> {
  /** The collection's path below `/api/v1`: `/customers`. */
  readonly path: `/${string}`;
  /** The record's name in a sentence: "customer", "machine family". */
  readonly noun: string;
  readonly plural: string;
  readonly schemas: {
    readonly record: z.ZodType;
    readonly page: z.ZodType;
    readonly create: z.ZodType<Create>;
    readonly update: z.ZodType<Update>;
    readonly query: z.ZodType<Query>;
    /** The 412 answer: a problem with the stored record in `current`. */
    readonly changedMeanwhile: z.ZodType;
  };
  readonly examples: {
    readonly record: unknown;
    readonly page: unknown;
    readonly create: unknown;
    readonly update: unknown;
    readonly history: unknown;
  };
  /** What the list's `q` searches, in a sentence. */
  readonly searches: string;
  /** The feature's own rules of a create or change, in a sentence or two (shown in both routes). */
  readonly rules?: string;
  readonly service: RecordRoutesService<Rec, Page, Create, Update, Query>;
}

const ETAG_HEADER: ResponseConfig['headers'] = {
  ETag: {
    description:
      'The version of the record, quoted (`"3"`): send it back in `If-Match` to change the record.',
    schema: { type: 'string', example: '"3"' },
  },
};

/** The `If-Match` of a change, documented as a header parameter; `requireIfMatch` reads and checks it. */
const IF_MATCH_HEADERS = z.object({
  'if-match': z
    .string()
    .optional()
    .meta({ description: 'The ETag of the version the change is made on (`"3"`).', example: '"3"' }),
});

const IF_MATCH_RULE =
  'Send the record’s ETag in `If-Match` (`If-Match: "3"`): without it the answer is 428; when the record ' +
  'has changed since, 412 with the stored record in `current`, and nothing is written.';

/** The signed-in person of a request that passed the guard. */
function actorOf(res: Response): Actor {
  const user = res.locals.user;
  if (user === undefined) throw new Error('The records routes run behind requireUser.');
  return user;
}

/** Sends the record's ETag and returns the record as the answer. */
function withEtag<Rec extends { readonly version: number }>(res: Response, record: Rec): Rec {
  res.setHeader('ETag', etagOf(record.version));
  return record;
}

/**
 * Declares a record's routes on the feature's table: list, create, get, change, archive, restore and
 * history. Each answer that carries one record carries its ETag; each change needs `If-Match`.
 */
export function addRecordRoutes<
  Rec extends { readonly id: number; readonly version: number },
  Page,
  Create,
  Update,
  Query,
>(table: RouteTable<RecordAccess>, spec: RecordRoutesSpec<Rec, Page, Create, Update, Query>): void {
  const { path, noun, plural, schemas, examples, service } = spec;
  const one = `${path}/{id}`;
  const notFound = `No ${noun} with this id in your organisation (another organisation’s ${plural} are not found either).`;
  const changedMeanwhile: ResponseConfig = {
    description: `The ${noun} changed since the version in \`If-Match\` (\`code\`: \`CHANGED_MEANWHILE\`); \`current\` holds it as stored, and \`ETag\` its version.`,
    headers: ETAG_HEADER,
    content: { [PROBLEM_MEDIA_TYPE]: { schema: schemas.changedMeanwhile } },
  };
  const versionRequired = 'No `If-Match` header, or `If-Match: *` (`code`: `VERSION_REQUIRED`).';
  /** Archive and restore: the same route but for what it does and how it is described. */
  const archiveRoute = (
    action: 'archive' | 'restore',
    summary: string,
    description: string,
    answer: string,
  ): RouteDeclaration<
    RecordAccess,
    typeof IdParamSchema,
    undefined,
    undefined,
    z.ZodType,
    typeof IF_MATCH_HEADERS
  > => ({
    method: 'post',
    path: `${one}/${action}`,
    summary,
    description: `${description} ${IF_MATCH_RULE}`,
    access: 'archive',
    params: IdParamSchema,
    headers: IF_MATCH_HEADERS,
    before: [requireIfMatch],
    answer: {
      status: 200,
      description: answer,
      schema: schemas.record,
      example: examples.record,
      headers: ETAG_HEADER,
    },
    problems: { 404: notFound, 412: changedMeanwhile, 428: versionRequired },
    handle: ({ params, res }) =>
      withEtag(res, service[action](actorOf(res), params.id, ifMatchVersions(res.locals))),
  });
  const rules = spec.rules === undefined ? '' : ` ${spec.rules}`;

  table
    .add<undefined, z.ZodType<Query>, undefined, z.ZodType>({
      method: 'get',
      path,
      summary: `List the organisation’s ${plural}`,
      description:
        `Search, filter, sort and page on the server. \`q\` finds ${spec.searches} (any case, anywhere in ` +
        'the text); `archived` chooses in use (the default), archived or all; ties of the sort are ' +
        'broken by id; `total` counts every match. A page beyond the last answers no items.',
      access: 'read',
      query: schemas.query,
      answer: {
        status: 200,
        description: `One page of ${plural}.`,
        schema: schemas.page,
        example: examples.page,
      },
      handle: ({ query, res }) => service.list(actorOf(res), query),
    })
    .add<undefined, undefined, z.ZodType<Create>, z.ZodType>({
      method: 'post',
      path,
      summary: `Add a ${noun}`,
      description: `The ${noun} starts at version 1; the change log records who created it.${rules}`,
      access: 'write',
      body: schemas.create,
      bodyExample: examples.create,
      bodyLimit: '64kb',
      answer: {
        status: 201,
        description: `The ${noun} as stored.`,
        schema: schemas.record,
        example: examples.record,
        headers: {
          ...ETAG_HEADER,
          Location: {
            description: `Where the new ${noun} is: \`${RECORDS_BASE_PATH}${path}/{id}\`.`,
            schema: { type: 'string' },
          },
        },
      },
      handle: ({ body, res }) => {
        const record = service.create(actorOf(res), body);
        res.setHeader('Location', `${RECORDS_BASE_PATH}${path}/${record.id}`);
        return withEtag(res, record);
      },
    })
    .add<typeof IdParamSchema, undefined, undefined, z.ZodType>({
      method: 'get',
      path: one,
      summary: `One ${noun}`,
      access: 'read',
      params: IdParamSchema,
      answer: {
        status: 200,
        description: `The ${noun}, archived or not.`,
        schema: schemas.record,
        example: examples.record,
        headers: ETAG_HEADER,
      },
      problems: { 404: notFound },
      handle: ({ params, res }) => withEtag(res, service.get(actorOf(res), params.id)),
    })
    .add<typeof IdParamSchema, undefined, z.ZodType<Update>, z.ZodType, typeof IF_MATCH_HEADERS>({
      method: 'patch',
      path: one,
      summary: `Change a ${noun}`,
      description:
        `The fields sent replace the stored ones; those left out stay as they are, and \`null\` clears ` +
        `a field that may be empty. ${IF_MATCH_RULE} A change that changes nothing keeps the version.${rules}`,
      access: 'write',
      params: IdParamSchema,
      headers: IF_MATCH_HEADERS,
      before: [requireIfMatch],
      body: schemas.update,
      bodyExample: examples.update,
      bodyLimit: '64kb',
      answer: {
        status: 200,
        description: `The ${noun} as changed.`,
        schema: schemas.record,
        example: examples.record,
        headers: ETAG_HEADER,
      },
      problems: { 404: notFound, 412: changedMeanwhile, 428: versionRequired },
      handle: ({ params, body, res }) =>
        withEtag(res, service.update(actorOf(res), params.id, ifMatchVersions(res.locals), body)),
    })
    .add(
      archiveRoute(
        'archive',
        `Archive a ${noun}`,
        `Takes the ${noun} out of the lists in use; nothing is deleted, and it can be restored.`,
        `The ${noun}, with \`archivedAt\` set.`,
      ),
    )
    .add(
      archiveRoute(
        'restore',
        `Restore an archived ${noun}`,
        `Puts the ${noun} back in use.`,
        `The ${noun}, with \`archivedAt\` null.`,
      ),
    )
    .add<typeof IdParamSchema, undefined, undefined, typeof RecordHistorySchema>({
      method: 'get',
      path: `${one}/history`,
      summary: `The changes of a ${noun}`,
      description: 'Who changed what and when, newest first: each field with its value before and after.',
      access: 'read',
      params: IdParamSchema,
      answer: {
        status: 200,
        description: 'The change log of the record.',
        schema: RecordHistorySchema,
        example: examples.history as z.input<typeof RecordHistorySchema>,
      },
      problems: { 404: notFound },
      handle: ({ params, res }) => service.history(actorOf(res), params.id),
    });
}
