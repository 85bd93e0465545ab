/*
 * Sign-in under attack: guesses sent all at once at one account, a flood of guesses at made-up
 * accounts, and one client spreading guesses over many accounts. Each is sent as an attacker would, in
 * parallel against the real app.
 */
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ProblemSchema } from '@counterpoise/api';
import type { Clock } from '../clock';
import { createTestOrganisation, TEST_PASSWORD, type TestOrganisation } from '../testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { AccountsRepo } from '../accounts/accounts.repo';
import { LOCK_AFTER, SLOW_DOWN_AFTER } from './auth.service';
import { HashGate, type HashGateLimits } from './hash-gate';
import { type GuardedApp, guardedApp, NO_CLIENT_LIMITS } from './testing/guarded-app';

let temporary: TemporaryDatabase;
let shop: TestOrganisation;
let test: GuardedApp;
let now: Date;
const clock: Clock = { now: () => now };

beforeEach(() => {
  now = new Date('2026-05-04T08:00:00Z');
  temporary = openTemporaryDatabase();
  shop = createTestOrganisation(temporary.database, 'Alder Spindle Works', now);
});
afterEach(() => {
  test.close();
  temporary.dispose();
});

const WRONG = 'a wrong guess at the password';
const signIn = (email: string, password: string) =>
  request(test.app).post('/api/v1/auth/sign-in').send({ email, password });
const codeOf = (response: request.Response) => ProblemSchema.parse(response.body).code;
const failuresOf = (email: string) => new AccountsRepo(temporary.database.orm).findFailures(email);

/** Fisher–Yates, so the right password sits anywhere among the guesses. */
function shuffled<T>(items: readonly T[]): T[] {
  const copy = [...items];
  for (let index = copy.length - 1; index > 0; index--) {
    const other = Math.floor(Math.random() * (index + 1));
    [copy[index], copy[other]] = [copy[other]!, copy[index]!];
  }
  return copy;
}

const statusesOf = (responses: request.Response[]) => ({
  ok: responses.filter((response) => response.status === 200).length,
  wrong: responses.filter((response) => response.status === 401).length,
  refused: responses.filter((response) => response.status === 429),
});

describe('guesses sent at once at one account', () => {
  it('are each counted before the password is checked: most are refused, and a lock follows', async () => {
    test = guardedApp(temporary.database, { clock, clientLimits: NO_CLIENT_LIMITS });
    const email = shop.people.technician.email;

    const burst = await Promise.all(
      shuffled([...Array<string>(39).fill(WRONG), TEST_PASSWORD]).map((password) => signIn(email, password)),
    );
    const first = statusesOf(burst);
    // Only the allowance is checked; the rest is refused without a hash, whatever its password.
    expect(first.ok + first.wrong).toBeLessThanOrEqual(SLOW_DOWN_AFTER);
    expect(first.refused).toHaveLength(40 - first.ok - first.wrong);
    for (const refused of first.refused) {
      expect(codeOf(refused)).toBe('SIGN_IN_THROTTLED');
      expect(Number(refused.headers['retry-after'])).toBeGreaterThanOrEqual(1);
    }
    if (first.ok === 0) {
      // Every wrong guess that was checked is in the count.
      expect(failuresOf(email)?.failures).toBe(first.wrong);
    } else {
      // The right password was among the first few checked (within the allowance) and cleared the count.
      expect(failuresOf(email)?.failures ?? 0).toBeLessThan(SLOW_DOWN_AFTER);
    }

    // The attacker keeps sending bursts of guesses as soon as each wait is over: each is checked and
    // counted up to the allowance of the moment (one a wait, past the slow-down), until the lock.
    let lockedAnswer: request.Response | undefined;
    for (let round = 0; round < 3 * LOCK_AFTER && lockedAnswer === undefined; round++) {
      const before = failuresOf(email);
      if (before?.blockedUntil && before.blockedUntil > now) now = before.blockedUntil;
      const counted = before?.failures ?? 0;
      const answers = await Promise.all(Array.from({ length: 20 }, () => signIn(email, WRONG)));
      const { ok, wrong, refused } = statusesOf(answers);
      expect(ok).toBe(0);
      expect(wrong).toBeGreaterThanOrEqual(1);
      expect(wrong).toBeLessThanOrEqual(Math.max(1, SLOW_DOWN_AFTER - counted));
      expect(refused).toHaveLength(20 - wrong);
      expect(failuresOf(email)?.failures).toBe(counted + wrong);
      lockedAnswer = refused.find((response) => codeOf(response) === 'SIGN_IN_LOCKED');
    }
    expect(lockedAnswer, 'the address is locked').toBeDefined();
    expect(failuresOf(email)?.failures).toBe(LOCK_AFTER);

    // Locked: even the right password is refused now.
    const afterLock = await Promise.all([signIn(email, TEST_PASSWORD), signIn(email, WRONG)]);
    expect(afterLock.map(codeOf)).toEqual(['SIGN_IN_LOCKED', 'SIGN_IN_LOCKED']);
  });

  it('count made-up addresses the same way', async () => {
    test = guardedApp(temporary.database, { clock, clientLimits: NO_CLIENT_LIMITS });
    const email = 'nobody-here@alder-spindle.test';
    const answers = await Promise.all(Array.from({ length: 30 }, () => signIn(email, WRONG)));
    const { ok, wrong, refused } = statusesOf(answers);
    expect(ok).toBe(0);
    expect(wrong).toBe(SLOW_DOWN_AFTER);
    expect(refused).toHaveLength(30 - SLOW_DOWN_AFTER);
    expect(failuresOf(email)?.failures).toBe(SLOW_DOWN_AFTER);
  });
});

/**
 * A gate that counts the hashes computing inside it, and can hold them there (as slow hashes would)
 * until the test lets them go: what it admits at once is then counted, never timed.
 */
class ObservedGate extends HashGate {
  computing = 0;
  mostAtOnce = 0;
  entered = 0;
  private opened: Promise<void> = Promise.resolve();
  private open: () => void = () => undefined;

  constructor(limits: HashGateLimits) {
    super(limits);
  }

  /** From now on, the hashes that get a place wait inside it until `release()`. */
  hold(): void {
    this.opened = new Promise((resolve) => (this.open = resolve));
  }

  release(): void {
    this.open();
  }

  override run<T>(work: () => Promise<T>): Promise<T> {
    this.entered++;
    return super.run(async () => {
      this.computing++;
      this.mostAtOnce = Math.max(this.mostAtOnce, this.computing);
      try {
        await this.opened;
        return await work();
      } finally {
        this.computing--;
      }
    });
  }
}

describe('a flood of sign-ins', () => {
  it('computes no more hashes at once than the gate allows, refuses the overflow with 429, and /me still answers', async () => {
    const gate = new ObservedGate({ maxRunning: 2, maxWaiting: 3 });
    test = guardedApp(temporary.database, { clock, clientLimits: NO_CLIENT_LIMITS, hashGate: gate });
    const { accessToken } = (await signIn(shop.people.viewer.email, TEST_PASSWORD).expect(200)).body as {
      accessToken: string;
    };
    const enteredBefore = gate.entered;

    gate.hold();
    const answered: request.Response[] = [];
    const flood = Array.from({ length: 12 }, (_, index) =>
      signIn(`made-up-${index}@alder-spindle.test`, WRONG).then((response) => {
        answered.push(response);
        return response;
      }),
    );
    // Every request has either reached the gate or been answered by it.
    await vi.waitFor(() => expect(gate.entered - enteredBefore + answered.length).toBe(12));
    expect(gate.computing).toBe(2);
    const me = await request(test.app).get('/api/v1/me').set('Authorization', `Bearer ${accessToken}`);
    expect(me.status).toBe(200);

    gate.release();
    const answers = await Promise.all(flood);
    expect(gate.mostAtOnce).toBe(2);
    const busy = answers.filter((response) => response.status === 429);
    expect(busy).toHaveLength(12 - 2 - 3);
    for (const response of busy) {
      expect(codeOf(response)).toBe('PASSWORD_CHECKS_BUSY');
      expect(response.headers['retry-after']).toBe('1');
      expect(ProblemSchema.parse(response.body).detail).toMatch(/too many passwords at once/);
    }
    expect(answers.filter((response) => response.status === 401)).toHaveLength(2 + 3);
    // A refused attempt was never checked, so it is not counted against its address either.
    const counted = Array.from({ length: 12 }, (_, index) =>
      failuresOf(`made-up-${index}@alder-spindle.test`),
    );
    expect(counted.filter((row) => row !== undefined)).toHaveLength(2 + 3);
  });
});

describe('the per-client limits', () => {
  it('hold back one client that fails to sign in too often, however many addresses it tries', async () => {
    test = guardedApp(temporary.database, {
      clock,
      clientLimits: { ...NO_CLIENT_LIMITS, signIn: { limit: 3, windowMs: 60_000 } },
    });
    // Colleagues behind one address who sign in well are not counted.
    for (const person of Object.values(shop.people)) await signIn(person.email, TEST_PASSWORD).expect(200);

    for (const index of [1, 2, 3]) await signIn(`guess-${index}@alder-spindle.test`, WRONG).expect(401);
    const held = await signIn('guess-4@alder-spindle.test', WRONG);
    expect(held.status).toBe(429);
    expect(held.headers['content-type']).toContain('application/problem+json');
    expect(codeOf(held)).toBe('CLIENT_THROTTLED');
    expect(ProblemSchema.parse(held.body).detail).toMatch(/at most 3 in 1 minute/);
    const retryAfter = Number(held.headers['retry-after']);
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(60);
    // Held back before the account counter: the fourth address was never counted.
    expect(failuresOf('guess-4@alder-spindle.test')).toBeUndefined();
    expect(codeOf(await signIn(shop.people.owner.email, TEST_PASSWORD))).toBe('CLIENT_THROTTLED');
  });

  it('limit reset links asked, new passwords chosen and invitations accepted from one client', async () => {
    const two = { limit: 2, windowMs: 60_000 };
    test = guardedApp(temporary.database, {
      clock,
      clientLimits: { passwordReset: two, passwordResetConfirm: two, invitationAccept: two },
    });
    const calls = [
      {
        send: () =>
          request(test.app).post('/api/v1/auth/password-reset').send({ email: 'x@alder-spindle.test' }),
        status: 202,
      },
      {
        send: () =>
          request(test.app)
            .post('/api/v1/auth/password-reset/confirm')
            .send({ token: 'A'.repeat(43), password: 'seven lanterns on the quay' }),
        status: 400,
      },
      {
        send: () =>
          request(test.app)
            .post(`/api/v1/invitations/${'A'.repeat(43)}/accept`)
            .send({ name: 'Someone', password: 'seven lanterns on the quay' }),
        status: 404,
      },
    ];
    for (const { send, status } of calls) {
      await send().expect(status);
      await send().expect(status);
      const held = await send();
      expect(held.status).toBe(429);
      expect(codeOf(held)).toBe('CLIENT_THROTTLED');
      expect(Number(held.headers['retry-after'])).toBeGreaterThan(0);
    }
    await test.background.settled();
  });
});
