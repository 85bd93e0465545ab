import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { CALC_ROUTES, ProblemSchema, UsageQuerySchema, UsageReportSchema } from '@counterpoise/api';
import { createApp } from '../app';
import type { OpenApiDocument } from '../openapi/openapi';
import type { Clock } from '../clock';
import { createTestKey } from '../keys/testing/test-keys';
import { ACCESS_TOKEN_SCHEME, REFRESH_COOKIE_SCHEME } from '../openapi/responses';
import { API_KEY_BEARER_SCHEME, API_KEY_HEADER_SCHEME } from '../keys/keys.openapi';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { UsageLog } from './usage-log';
import { UsageRepo } from './usage.repo';
import { buildUsageReport } from './usage.service';

let temporary: TemporaryDatabase;
let usageLog: UsageLog;
let key: string;
let keyId: number;
let otherKeyId: number;
const now = new Date('2026-05-04T12:00:00Z');
const clock: Clock = { now: () => now };

const CALC = 'POST /api/v1/calc/single-plane';
const TWO = 'POST /api/v1/calc/multi-plane';
const BATCH = 'POST /api/v1/calc/batch';
const USAGE = 'GET /api/v1/usage';

beforeEach(() => {
  temporary = openTemporaryDatabase();
  usageLog = new UsageLog(temporary.database);
  const created = createTestKey(temporary.database, { name: 'Dealer portal' });
  key = created.key;
  keyId = created.record.id;
  otherKeyId = createTestKey(temporary.database, { name: 'Someone else' }).record.id;

  // key, time, route, status, duration in ms, bytes, calculations, and a batch's items' errors
  const rows: [number, string, string, number, number, number, number, Record<string, number>?][] = [
    [keyId, '2026-05-01T08:00:00Z', CALC, 200, 1, 100, 1],
    [keyId, '2026-05-01T23:59:59.999Z', CALC, 422, 3, 50, 1],
    [keyId, '2026-05-02T00:00:00Z', TWO, 200, 2, 300, 1],
    // A batch of two, one item refused: two calculations in one request.
    [keyId, '2026-05-02T12:00:00Z', BATCH, 200, 2, 160, 2, { 422: 1 }],
    [keyId, '2026-05-02T13:00:00Z', USAGE, 200, 1, 500, 0],
    [keyId, '2026-05-03T10:00:00Z', CALC, 429, 0.5, 40, 1],
    [keyId, '2026-05-03T11:00:00Z', TWO, 500, 4, 30, 1],
    [keyId, '2026-03-01T10:00:00Z', CALC, 200, 1, 100, 1],
    [otherKeyId, '2026-05-02T10:00:00Z', CALC, 200, 1, 999, 1],
  ];
  for (const [id, at, route, status, durationMs, bytes, calculations, itemErrors] of rows) {
    usageLog.record({
      keyId: id,
      at: new Date(at),
      route,
      status,
      durationMs,
      bytes,
      calculations,
      ...(itemErrors ? { itemErrors } : {}),
    });
  }
  usageLog.flush();
});
afterEach(() => {
  usageLog.close();
  temporary.dispose();
});

const usage = (query: string) =>
  request(createApp({ database: temporary.database, usageLog, clock, log: () => undefined }))
    .get(`/api/v1/usage${query}`)
    .set('X-Api-Key', key);

describe('GET /api/v1/usage', () => {
  it('sums the caller’s requests per UTC day over the last 30 days by default', async () => {
    const response = await usage('').expect(200);
    expect(response.headers['cache-control']).toBe('no-store');
    const report = UsageReportSchema.parse(response.body);
    expect(report).toEqual({
      key: { id: keyId, name: 'Dealer portal', prefix: expect.stringMatching(/^cpk_/) },
      from: '2026-04-04T12:00:00.000Z',
      to: '2026-05-04T12:00:00.000Z',
      groupBy: 'day',
      groups: [
        {
          group: '2026-05-01',
          requests: 2,
          calculations: 2,
          clientErrors: 1,
          serverErrors: 0,
          rateLimited: 0,
          errorsByStatus: [{ status: 422, answers: 1 }],
          bytes: 150,
          meanDurationMs: 2,
          maxDurationMs: 3,
        },
        {
          // The two-plane call, the batch and the report itself; the batch's items are calculations,
          // their sizes and times are the batch's.
          group: '2026-05-02',
          requests: 3,
          calculations: 3,
          clientErrors: 1,
          serverErrors: 0,
          rateLimited: 0,
          errorsByStatus: [{ status: 422, answers: 1 }],
          bytes: 960,
          meanDurationMs: 1.667,
          maxDurationMs: 2,
        },
        {
          group: '2026-05-03',
          requests: 2,
          calculations: 2,
          clientErrors: 1,
          serverErrors: 1,
          rateLimited: 1,
          errorsByStatus: [
            { status: 429, answers: 1 },
            { status: 500, answers: 1 },
          ],
          bytes: 70,
          meanDurationMs: 2.25,
          maxDurationMs: 4,
        },
      ],
      total: {
        requests: 7,
        calculations: 7,
        clientErrors: 3,
        serverErrors: 1,
        rateLimited: 1,
        errorsByStatus: [
          { status: 422, answers: 2 },
          { status: 429, answers: 1 },
          { status: 500, answers: 1 },
        ],
        bytes: 1180,
        meanDurationMs: 1.929,
        maxDurationMs: 4,
      },
    });
  });

  it('groups by route, busiest first, a batch’s calculations and items’ errors under the batch', async () => {
    const report = UsageReportSchema.parse((await usage('?groupBy=route').expect(200)).body);
    expect(
      report.groups.map((group) => [group.group, group.requests, group.calculations, group.errorsByStatus]),
    ).toEqual([
      [
        CALC,
        3,
        3,
        [
          { status: 422, answers: 1 },
          { status: 429, answers: 1 },
        ],
      ],
      [TWO, 2, 2, [{ status: 500, answers: 1 }]],
      [USAGE, 1, 0, []],
      [BATCH, 1, 2, [{ status: 422, answers: 1 }]],
    ]);
    expect(report.total).toMatchObject({ requests: 7, calculations: 7 });
  });

  it('groups by key, naming it, and never shows another key’s usage', async () => {
    const report = UsageReportSchema.parse((await usage('?groupBy=key&from=2026-01-01').expect(200)).body);
    expect(report.groups).toHaveLength(1);
    expect(report.groups[0]).toMatchObject({
      group: report.key.prefix,
      keyName: 'Dealer portal',
      requests: 8,
      calculations: 8,
      bytes: 1280,
      errorsByStatus: [
        { status: 422, answers: 2 },
        { status: 429, answers: 1 },
        { status: 500, answers: 1 },
      ],
    });
  });

  it('reads a date as a whole UTC day and a date-time as an instant, from included and to excluded', async () => {
    const days = UsageReportSchema.parse((await usage('?from=2026-05-01&to=2026-05-01').expect(200)).body);
    expect([days.from, days.to]).toEqual(['2026-05-01T00:00:00.000Z', '2026-05-02T00:00:00.000Z']);
    expect(days.total.requests).toBe(2);

    const instants = UsageReportSchema.parse(
      (await usage('?from=2026-05-01T10:00:00%2B02:00&to=2026-05-02T00:00:00Z').expect(200)).body,
    );
    expect(instants.from).toBe('2026-05-01T08:00:00.000Z');
    expect(instants.total.requests).toBe(2);
  });

  it('answers an empty span with no groups and zero totals', async () => {
    const report = UsageReportSchema.parse((await usage('?from=2025-01-01&to=2025-01-31').expect(200)).body);
    expect(report.groups).toEqual([]);
    expect(report.total).toEqual({
      requests: 0,
      calculations: 0,
      clientErrors: 0,
      serverErrors: 0,
      rateLimited: 0,
      errorsByStatus: [],
      bytes: 0,
      meanDurationMs: 0,
      maxDurationMs: 0,
    });
  });

  it.each([
    ['?groupBy=week', [{ path: 'groupBy', message: 'Expected day, route or key.' }]],
    ['?from=yesterday', [{ path: 'from', message: expect.stringMatching(/Expected a date \(2026-05-01\)/) }]],
    ['?from=2026-02-30', [{ path: 'from', message: expect.stringMatching(/Expected a date/) }]],
    ['?to=2026-05-01T10:00:00', [{ path: 'to', message: expect.stringMatching(/with its zone/) }]],
    ['?groupby=route', [{ path: 'groupby', message: expect.stringMatching(/not a field here/) }]],
    ['?groupBy=day&groupBy=key', [{ path: 'groupBy', message: 'Expected day, route or key.' }]],
    ['?from=2026-05-03&to=2026-05-01', [{ path: 'to', message: 'to must come after from.' }]],
    ['?from=2026-06-01', [{ path: 'from', message: expect.stringMatching(/in the future/) }]],
    [
      '?from=2025-01-01&to=2026-05-01',
      [{ path: 'from', message: expect.stringMatching(/at most 366 days/) }],
    ],
  ])('answers %s with a 400 problem naming the parameter', async (query, errors) => {
    const response = await usage(query).expect(400);
    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(ProblemSchema.parse(response.body)).toEqual({
      type: 'about:blank',
      title: 'Bad Request',
      status: 400,
      code: 'INVALID_REQUEST',
      detail: expect.stringMatching(new RegExp(`^${errors[0]?.path}: `)),
      errors,
      instance: '/api/v1/usage',
    });
  });

  it('leaves the stored usage as it was after a bad query', async () => {
    const count = () => temporary.database.sqlite.prepare('SELECT count(*) FROM api_usage').pluck().get();
    const before = count();
    await usage('?groupBy=week').expect(400);
    expect(count()).toBe(before);
  });
});

describe('the report of requests made at once', () => {
  it('counts every request, calculation and refusal that the callers were answered', async () => {
    const app = createApp({ database: temporary.database, usageLog, log: () => undefined });
    const fresh = createTestKey(temporary.database, { name: 'Bench logger', limitPerMinute: 40 });
    const single = CALC_ROUTES['single-plane'].example;
    const call = (path: string, body: object) =>
      request(app).post(`/api/v1/calc/${path}`).set('X-Api-Key', fresh.key).send(body);
    // 12 good calls, 6 refused bodies, 4 batches of 3 (one item refused each): 30 calculations asked in
    // 22 requests, under a limit of 40 a minute; then 12 more calls, of which the limit lets 10 through.
    const answers = await Promise.all([
      ...Array.from({ length: 12 }, () => call('single-plane', single)),
      ...Array.from({ length: 6 }, () =>
        call('single-plane', { initial: single.initial, trialWeight: single.trialWeight }),
      ),
      ...Array.from({ length: 4 }, () =>
        call('batch', {
          items: [
            { route: 'single-plane', body: single },
            { route: 'single-plane', body: single },
            { route: 'radius', body: { mass: 1, fromRadius: 1, toRadius: -1 } },
          ],
        }),
      ),
    ]);
    const more = await Promise.all(Array.from({ length: 12 }, () => call('single-plane', single)));
    const statuses = [...answers, ...more].map((answer) => answer.status);
    expect(statuses.filter((status) => status === 200)).toHaveLength(12 + 4 + 10);
    expect(statuses.filter((status) => status === 400)).toHaveLength(6);
    expect(statuses.filter((status) => status === 429)).toHaveLength(2);
    const itemStatuses = answers
      .filter((answer) => answer.body.items !== undefined)
      .flatMap((answer) => (answer.body.items as { status: number }[]).map((item) => item.status));
    expect(itemStatuses.filter((status) => status === 400)).toHaveLength(4);
    usageLog.flush();

    // Read on the service: over its limit, the key is refused the report too.
    const report = buildUsageReport(
      new UsageRepo(temporary.database.orm),
      { id: fresh.record.id, name: 'Bench logger', prefix: fresh.record.prefix, limitPerMinute: 40 },
      UsageQuerySchema.parse({ groupBy: 'route' }),
      new Date(Date.now() + 1000),
    );
    const errors = statuses.filter((status) => status >= 400).length + 4;
    expect(report.total).toMatchObject({
      requests: 22 + 12,
      calculations: 12 + 6 + 12 + 12,
      clientErrors: errors,
      rateLimited: 2,
      errorsByStatus: [
        { status: 400, answers: 6 + 4 },
        { status: 429, answers: 2 },
      ],
    });
    expect(report.groups.map((group) => [group.group, group.requests, group.calculations])).toEqual([
      [CALC, 12 + 6 + 12, 12 + 6 + 12],
      [BATCH, 4, 12],
    ]);
    // One row per request: the batches' items have none of their own.
    expect(new UsageRepo(temporary.database.orm).count()).toBe(9 + 22 + 12);
  });
});

describe('the OpenAPI document', () => {
  let document: OpenApiDocument;
  beforeEach(() => {
    document = createApp({ database: temporary.database }).locals.openApiDocument!;
  });

  it('documents the usage route with the key’s security schemes and its refusals', () => {
    const operation = document.paths?.['/api/v1/usage']?.get;
    expect(operation?.security).toEqual([
      { [API_KEY_HEADER_SCHEME]: [] },
      { [API_KEY_BEARER_SCHEME]: [] },
      { [ACCESS_TOKEN_SCHEME]: [] },
    ]);
    expect(Object.keys(operation?.responses ?? {})).toEqual(['200', '400', '401', '403', '429']);
    expect(operation?.parameters?.map((parameter) => ('name' in parameter ? parameter.name : ''))).toEqual([
      'from',
      'to',
      'groupBy',
    ]);
    expect(document.components?.securitySchemes).toEqual({
      [API_KEY_HEADER_SCHEME]: expect.objectContaining({ type: 'apiKey', in: 'header', name: 'X-Api-Key' }),
      [API_KEY_BEARER_SCHEME]: expect.objectContaining({ type: 'http', scheme: 'bearer' }),
      [ACCESS_TOKEN_SCHEME]: expect.objectContaining({ type: 'http', scheme: 'bearer', bearerFormat: 'JWT' }),
      [REFRESH_COOKIE_SCHEME]: expect.objectContaining({ type: 'apiKey', in: 'cookie', name: 'cp_refresh' }),
    });
  });

  it('carries a usage example that the schema accepts', () => {
    const example = (document.components?.schemas?.['UsageReport'] as { example?: unknown }).example;
    expect(UsageReportSchema.safeParse(example).success).toBe(true);
  });
});
