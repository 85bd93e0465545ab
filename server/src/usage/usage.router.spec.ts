import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ProblemSchema, UsageReportSchema } from '@counterpoise/api';
import { createApp } from '../app';
import type { OpenApiDocument } from '../openapi/openapi';
import type { Clock } from '../clock';
import { createTestKey } from '../keys/testing/test-keys';
import { ACCESS_TOKEN_SCHEME, REFRESH_COOKIE_SCHEME } from '../openapi/responses';
import { API_KEY_BEARER_SCHEME, API_KEY_HEADER_SCHEME } from '../keys/keys.openapi';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { UsageLog } from './usage-log';

let temporary: TemporaryDatabase;
let usageLog: UsageLog;
let key: string;
let keyId: number;
let otherKeyId: number;
const now = new Date('2026-05-04T12:00:00Z');
const clock: Clock = { now: () => now };

const CALC = 'POST /api/v1/calc/single-plane';
const TWO = 'POST /api/v1/calc/two-plane';

beforeEach(() => {
  temporary = openTemporaryDatabase();
  usageLog = new UsageLog(temporary.database);
  const created = createTestKey(temporary.database, { name: 'Dealer portal' });
  key = created.key;
  keyId = created.record.id;
  otherKeyId = createTestKey(temporary.database, { name: 'Someone else' }).record.id;

  // key, time, route, status, duration in ms, bytes
  const rows: [number, string, string, number, number, number][] = [
    [keyId, '2026-05-01T08:00:00Z', CALC, 200, 1, 100],
    [keyId, '2026-05-01T23:59:59.999Z', CALC, 422, 3, 50],
    [keyId, '2026-05-02T00:00:00Z', TWO, 200, 2, 300],
    [keyId, '2026-05-03T10:00:00Z', CALC, 429, 0.5, 40],
    [keyId, '2026-05-03T11:00:00Z', TWO, 500, 4, 30],
    [keyId, '2026-03-01T10:00:00Z', CALC, 200, 1, 100],
    [otherKeyId, '2026-05-02T10:00:00Z', CALC, 200, 1, 999],
  ];
  for (const [id, at, route, status, durationMs, bytes] of rows) {
    usageLog.record({ keyId: id, at: new Date(at), route, status, durationMs, bytes });
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
          clientErrors: 1,
          serverErrors: 0,
          rateLimited: 0,
          bytes: 150,
          meanDurationMs: 2,
          maxDurationMs: 3,
        },
        {
          group: '2026-05-02',
          requests: 1,
          clientErrors: 0,
          serverErrors: 0,
          rateLimited: 0,
          bytes: 300,
          meanDurationMs: 2,
          maxDurationMs: 2,
        },
        {
          group: '2026-05-03',
          requests: 2,
          clientErrors: 1,
          serverErrors: 1,
          rateLimited: 1,
          bytes: 70,
          meanDurationMs: 2.25,
          maxDurationMs: 4,
        },
      ],
      total: {
        requests: 5,
        clientErrors: 2,
        serverErrors: 1,
        rateLimited: 1,
        bytes: 520,
        meanDurationMs: 2.1,
        maxDurationMs: 4,
      },
    });
  });

  it('groups by route, busiest first', async () => {
    const report = UsageReportSchema.parse((await usage('?groupBy=route').expect(200)).body);
    expect(report.groups.map((group) => [group.group, group.requests])).toEqual([
      [CALC, 3],
      [TWO, 2],
    ]);
    expect(report.total.requests).toBe(5);
  });

  it('groups by key, naming it, and never shows another key’s usage', async () => {
    const report = UsageReportSchema.parse((await usage('?groupBy=key&from=2026-01-01').expect(200)).body);
    expect(report.groups).toHaveLength(1);
    expect(report.groups[0]).toMatchObject({
      group: report.key.prefix,
      keyName: 'Dealer portal',
      requests: 6,
      bytes: 620,
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
      clientErrors: 0,
      serverErrors: 0,
      rateLimited: 0,
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
