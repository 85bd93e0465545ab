import express from 'express';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { CALC_ROUTES } from '@counterpoise/api';
import { createApp } from '../app';
import { createTestKey } from '../keys/testing/test-keys';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { UsageLog } from '../usage/usage-log';
import { isJsonApiPath, securityHeaders } from './security-headers';

let temporary: TemporaryDatabase;
let usageLog: UsageLog;
let key: string;

beforeEach(() => {
  temporary = openTemporaryDatabase();
  usageLog = new UsageLog(temporary.database);
  key = createTestKey(temporary.database).key;
});
afterEach(() => {
  usageLog.close();
  temporary.dispose();
});

const app = (secureTransport?: boolean) =>
  createApp({
    database: temporary.database,
    usageLog,
    log: () => undefined,
    ...(secureTransport === undefined ? {} : { secureTransport }),
  });

const API_POLICY = "default-src 'none';frame-ancestors 'none'";

describe('the API’s headers on paths spelt another way', () => {
  it.each([
    ['GET', '/API/v1/usage'],
    ['GET', '/Api/V1/usage'],
    ['GET', '/api/v1/USAGE/'],
    ['POST', '/API/v1/calc/Radius'],
    ['POST', '/api/V1/CALC/radius/'],
  ])('%s %s reaches the API, and gets the API’s headers', async (method, path) => {
    const call = method === 'GET' ? request(app()).get(path) : request(app()).post(path);
    const response = await call.set('X-Api-Key', key).send(CALC_ROUTES.radius.example);
    expect(response.status).toBe(200);
    expect(response.headers['content-security-policy']).toBe(API_POLICY);
    expect(response.headers['cache-control']).toBe('no-store');
    expect(response.headers['x-frame-options']).toBe('DENY');
    expect(response.headers['x-dns-prefetch-control']).toBeUndefined();
  });

  it('reads a path as Express routes it', () => {
    expect(isJsonApiPath('/API/v1/calc/radius')).toBe(true);
    expect(isJsonApiPath('/api//v1/usage')).toBe(true);
    expect(isJsonApiPath('/API/DOCS/')).toBe(false);
    expect(isJsonApiPath('/Api')).toBe(false);
    expect(isJsonApiPath('/jobs/api/x')).toBe(false);
  });

  it('keeps the pages’ headers on Swagger UI, however it is spelt', async () => {
    const response = await request(app()).get('/API/Docs/').set('Accept', 'text/html');
    expect(response.headers['content-security-policy']).toContain("default-src 'self'");
  });

  it('lets the pages show images from their own object URLs (the photos, fetched with the access token)', async () => {
    const response = await request(app()).get('/api/docs/').set('Accept', 'text/html');
    expect(response.headers['content-security-policy']).toContain("img-src 'self' data: blob:");
  });
});

describe('the API’s headers', () => {
  it('are the OWASP list for JSON answers, and none of the pages’ set', async () => {
    const response = await request(app())
      .post('/api/v1/calc/radius')
      .set('X-Api-Key', key)
      .send(CALC_ROUTES.radius.example);
    expect(response.status).toBe(200);
    const security = Object.fromEntries(
      Object.entries(response.headers).filter(([name]) =>
        /^(cache-control|content-security-policy|cross-origin|referrer-policy|x-|origin-agent|strict-transport)/.test(
          name,
        ),
      ),
    );
    expect(security).toEqual({
      'cache-control': 'no-store',
      'content-security-policy': API_POLICY,
      'cross-origin-resource-policy': 'same-origin',
      'referrer-policy': 'no-referrer',
      'x-content-type-options': 'nosniff',
      'x-frame-options': 'DENY',
    });
  });
});

describe('Strict-Transport-Security', () => {
  it('is not sent over plain HTTP, on the API or on the pages', async () => {
    for (const path of ['/api/health', '/api/v1/usage', '/', '/api/docs/']) {
      const response = await request(app()).get(path).set('X-Api-Key', key).set('Accept', 'text/html');
      expect(response.headers['strict-transport-security'], path).toBeUndefined();
      expect(response.headers['x-content-type-options'], path).toBe('nosniff');
    }
  });

  it('is sent on every answer when the server is configured as reached over HTTPS', async () => {
    for (const path of ['/api/health', '/api/v1/usage', '/', '/api/docs/']) {
      const response = await request(app(true)).get(path).set('X-Api-Key', key).set('Accept', 'text/html');
      expect(response.headers['strict-transport-security'], path).toBe('max-age=31536000; includeSubDomains');
    }
  });

  it('is sent on an answer to a request that came over HTTPS', async () => {
    const behindProxy = express();
    // Express reads the scheme from the proxy it trusts, so req.secure is true as over TLS.
    behindProxy.set('trust proxy', 'loopback');
    behindProxy.use(securityHeaders());
    behindProxy.get('/{*splat}', (_req, res) => {
      res.json({});
    });
    const secure = await request(behindProxy).get('/api/health').set('X-Forwarded-Proto', 'https');
    expect(secure.headers['strict-transport-security']).toBe('max-age=31536000; includeSubDomains');
    expect(secure.headers['content-security-policy']).toBe(API_POLICY);
    const plain = await request(behindProxy).get('/api/health').set('X-Forwarded-Proto', 'http');
    expect(plain.headers['strict-transport-security']).toBeUndefined();
  });
});
