import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createApp } from '../app';
import { TEST_HASH_COST } from '../testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';

let temporary: TemporaryDatabase;
beforeEach(() => (temporary = openTemporaryDatabase()));
afterEach(() => temporary.dispose());

/** An app that lets each client address fail one sign-in per minute. */
const app = (trustProxy?: string) =>
  createApp({
    database: temporary.database,
    log: () => undefined,
    ...(trustProxy === undefined ? {} : { trustProxy }),
    accounts: {
      passwordHashCost: TEST_HASH_COST,
      clientLimits: { signIn: { limit: 1, windowMs: 60_000 } },
    },
  });

const signInFrom = (server: ReturnType<typeof app>, forwardedFor: string, email: string) =>
  request(server)
    .post('/api/v1/auth/sign-in')
    .set('X-Forwarded-For', forwardedFor)
    .send({ email, password: 'not the password at all' });

describe('the client address of the per-client limits', () => {
  it('is the proxy’s own when no proxy is trusted: a forged X-Forwarded-For buys no new allowance', async () => {
    const server = app();
    expect((await signInFrom(server, '203.0.113.7', 'a@shop.test')).status).toBe(401);
    expect((await signInFrom(server, '198.51.100.9', 'b@shop.test')).status).toBe(429);
  });

  it('is the forwarded client’s behind a trusted proxy, so one client does not use up another’s', async () => {
    const server = app('loopback');
    expect((await signInFrom(server, '203.0.113.7', 'a@shop.test')).status).toBe(401);
    expect((await signInFrom(server, '203.0.113.7', 'b@shop.test')).status).toBe(429);
    expect((await signInFrom(server, '198.51.100.9', 'c@shop.test')).status).toBe(401);
  });
});
