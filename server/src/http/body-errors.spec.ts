import { gzipSync } from 'node:zlib';
import express from 'express';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { CALC_ROUTES, ProblemSchema } from '@counterpoise/api';
import { createApp } from '../app';
import { createTestKey } from '../keys/testing/test-keys';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { UsageLog } from '../usage/usage-log';
import { problemHandler, requireJsonBody } from './problem';

/*
 * Bodies an attacker's probe sends to see what breaks: charsets JSON is never sent in, and bodies that
 * claim a compression they do not have. Each is the client's fault: a problem answer, and not a line in
 * the server's log.
 */

let temporary: TemporaryDatabase;
let usageLog: UsageLog;
let key: string;
let logged: unknown[];

beforeEach(() => {
  temporary = openTemporaryDatabase();
  usageLog = new UsageLog(temporary.database);
  key = createTestKey(temporary.database).key;
  logged = [];
});
afterEach(() => {
  usageLog.close();
  temporary.dispose();
});

const app = () =>
  createApp({
    database: temporary.database,
    usageLog,
    log: (message, error) => logged.push([message, error]),
  });

const RADIUS = JSON.stringify(CALC_ROUTES.radius.example);

/** Sends the bytes as they are: superagent would otherwise serialise a Buffer sent as JSON. */
const asIs = (bytes: unknown) => bytes as string;
const ROUTES = [
  ['a keyed calculator route', '/api/v1/calc/radius', RADIUS],
  ['the keyed batch route', '/api/v1/calc/batch', JSON.stringify({ items: [{ route: 'radius', body: {} }] })],
  ['an accounts route', '/api/v1/auth/sign-in', JSON.stringify({ email: 'a@b.test', password: 'x' })],
] as const;

const BODIES: [string, Record<string, string>, (json: string) => Buffer, number][] = [
  ['charset=koi8-r', { 'Content-Type': 'application/json; charset=koi8-r' }, Buffer.from, 415],
  ['charset=utf-7', { 'Content-Type': 'application/json; charset=utf-7' }, Buffer.from, 415],
  ['charset="UTF-16"', { 'Content-Type': 'application/json; charset="UTF-16"' }, Buffer.from, 415],
  ['charset=x-no-such', { 'Content-Type': 'application/json;charset=x-no-such' }, Buffer.from, 415],
  ['an unknown Content-Encoding', { 'Content-Encoding': 'compress' }, Buffer.from, 415],
  ['two Content-Encodings', { 'Content-Encoding': 'gzip, gzip' }, (json) => gzipSync(json), 415],
  ['gzip that is not gzip', { 'Content-Encoding': 'gzip' }, Buffer.from, 400],
  ['gzip cut short', { 'Content-Encoding': 'gzip' }, (json) => gzipSync(json).subarray(0, 12), 400],
  ['deflate that is not deflate', { 'Content-Encoding': 'deflate' }, Buffer.from, 400],
  ['br that is not br', { 'Content-Encoding': 'br' }, Buffer.from, 400],
];

describe.each(ROUTES)('a body the server cannot read, on %s', (_name, path, json) => {
  it.each(BODIES)('%s is a problem, and not logged', async (_case, headers, encode, status) => {
    const response = await request(app())
      .post(path)
      .set('X-Api-Key', key)
      .set('Content-Type', 'application/json')
      .set(headers)
      .serialize(asIs)
      .send(encode(json));
    expect(response.status).toBe(status);
    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    const problem = ProblemSchema.parse(response.body);
    expect(problem.detail).toMatch(status === 415 ? /UTF-8|Content-Encoding/ : /corrupt or cut short/);
    expect(logged).toEqual([]);
  });
});

describe('bodies the server reads', () => {
  it.each([
    ['no charset', 'application/json'],
    ['charset=utf-8', 'application/json; charset=utf-8'],
    ['charset="UTF-8"', 'application/json; charset="UTF-8"'],
  ])('takes JSON with %s', async (_case, contentType) => {
    const response = await request(app())
      .post('/api/v1/calc/radius')
      .set('X-Api-Key', key)
      .set('Content-Type', contentType)
      .send(RADIUS)
      .expect(200);
    expect(response.body.mass).toBe(90);
  });

  it('takes a gzip body that is gzip', async () => {
    const response = await request(app())
      .post('/api/v1/calc/radius')
      .set('X-Api-Key', key)
      .set('Content-Type', 'application/json')
      .set('Content-Encoding', 'gzip')
      .serialize(asIs)
      .send(gzipSync(RADIUS))
      .expect(200);
    expect(response.body.mass).toBe(90);
  });
});

describe('requireJsonBody', () => {
  /** What requireJsonBody decides for a request with these headers, beside what `req.is` says. */
  function decide(headers: Record<string, string>): { passed: boolean; isJson: boolean } {
    const req = Object.assign(Object.create(express.request) as express.Request, { headers });
    let passed = false;
    requireJsonBody(req, {} as express.Response, (error?: unknown) => {
      passed = error === undefined;
    });
    return { passed, isJson: Boolean(req.is('application/json')) };
  }

  it.each<[string, Record<string, string>]>([
    ['JSON with a length', { 'content-type': 'application/json', 'content-length': '12' }],
    ['JSON sent in chunks', { 'content-type': 'application/json', 'transfer-encoding': 'chunked' }],
    ['JSON of length 0', { 'content-type': 'application/json', 'content-length': '0' }],
    ['JSON with no body', { 'content-type': 'application/json' }],
    ['JSON with a length that is no number', { 'content-type': 'application/json', 'content-length': 'x' }],
    ['JSON in capitals', { 'content-type': 'APPLICATION/JSON', 'content-length': '2' }],
    ['a JSON suffix type', { 'content-type': 'application/problem+json', 'content-length': '2' }],
    ['text', { 'content-type': 'text/plain', 'content-length': '2' }],
    ['no type', { 'content-length': '2' }],
  ])('lets %s through exactly when req.is takes it for JSON', (_case, headers) => {
    const { passed, isJson } = decide(headers);
    expect(passed).toBe(isJson);
  });
});

describe('the body parser’s own refusals, where no charset check runs first', () => {
  it('answers an unsupported charset with a 415 problem, not logged', async () => {
    const bare = express();
    bare.post('/', express.json(), (_req, res) => {
      res.json({});
    });
    bare.use(problemHandler((message, error) => logged.push([message, error])));
    const response = await request(bare)
      .post('/')
      .set('Content-Type', 'application/json; charset=koi8-r')
      .send('{}')
      .expect(415);
    expect(ProblemSchema.parse(response.body).detail).toMatch(/UTF-8/);
    expect(logged).toEqual([]);
  });
});
