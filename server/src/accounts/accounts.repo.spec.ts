import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { AccountsRepo } from './accounts.repo';
import {
  FORGET_FAILURES_MS,
  LOCK_AFTER,
  SIGN_IN_FAILURE_POLICY,
  waitAfterFailures,
} from '../auth/auth.service';

let temporary: TemporaryDatabase;
let repo: AccountsRepo;
beforeEach(() => {
  temporary = openTemporaryDatabase();
  repo = new AccountsRepo(temporary.database.orm);
});
afterEach(() => temporary.dispose());

const EMAIL = 'someone@fir-bearing.test';

describe('AccountsRepo.countSignInAttempt', () => {
  it('sets the wait of waitAfterFailures after each attempt, from the first to past the lock', () => {
    let now = new Date('2026-05-04T08:00:00Z');
    for (let failures = 1; failures <= LOCK_AFTER + 2; failures++) {
      const counted = repo.countSignInAttempt(EMAIL, now, SIGN_IN_FAILURE_POLICY);
      const wait = waitAfterFailures(failures);
      expect(counted, `attempt ${failures}`).toEqual({
        failures,
        blockedUntil: wait > 0 ? new Date(now.getTime() + wait) : null,
      });
      // The next attempt comes as soon as it may.
      if (counted?.blockedUntil) now = counted.blockedUntil;
    }
  });

  it('refuses an attempt while the address waits, without counting it or moving the wait', () => {
    const now = new Date('2026-05-04T08:00:00Z');
    for (let failures = 1; failures <= 5; failures++)
      repo.countSignInAttempt(EMAIL, now, SIGN_IN_FAILURE_POLICY);
    const before = repo.findFailures(EMAIL);
    expect(
      repo.countSignInAttempt(EMAIL, new Date(now.getTime() + 999), SIGN_IN_FAILURE_POLICY),
    ).toBeUndefined();
    expect(repo.findFailures(EMAIL)).toEqual(before);
  });

  it('counts from one again once the last failure is an hour old', () => {
    const now = new Date('2026-05-04T08:00:00Z');
    for (let failures = 1; failures <= 4; failures++)
      repo.countSignInAttempt(EMAIL, now, SIGN_IN_FAILURE_POLICY);
    const later = new Date(now.getTime() + FORGET_FAILURES_MS);
    expect(repo.countSignInAttempt(EMAIL, later, SIGN_IN_FAILURE_POLICY)).toEqual({
      failures: 1,
      blockedUntil: null,
    });
  });
});
