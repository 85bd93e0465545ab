import { randomUUID } from 'node:crypto';
import {
  ACCOUNTS_PROBLEM_CODES,
  type FieldError,
  type Permission,
  ROLE_PERMISSIONS,
  type Session,
  type User,
} from '@counterpoise/api';
import type { Clock } from '../clock';
import { HttpProblem } from '../http/problem';
import type { Mailer } from '../mail/mailer';
import { composeMail } from '../mail/mailer';
import type { AccountsRepo, UserRecord } from './accounts.repo';
import { decoyHash, hashPassword, passwordWeakness, type ScryptCost, verifyPassword } from './passwords';
import {
  ACCESS_TOKEN_TTL_SECONDS,
  generateSecret,
  hashSecret,
  signAccessToken,
  verifyAccessToken,
} from './tokens';

/** What the accounts features are configured with. */
export interface AuthSettings {
  /** The HS256 key of access tokens. */
  readonly signingKey: Uint8Array;
  readonly passwordCost: ScryptCost;
  /** Whether the refresh cookie is marked `Secure` (HTTPS only). */
  readonly secureCookie: boolean;
  /** The workbench's address, the start of the links in e-mails (no trailing slash). */
  readonly publicUrl: string;
}

/** How long a refresh token lasts without being used; each refresh starts the span again. */
export const REFRESH_TOKEN_TTL_MS = 14 * 24 * 3_600_000;
/** How long a password-reset link works. */
export const PASSWORD_RESET_TTL_MS = 3_600_000;

/** Failed sign-ins of an address in a row before each further attempt must wait. */
export const SLOW_DOWN_AFTER = 5;
/** Failed sign-ins in a row that lock the address. */
export const LOCK_AFTER = 10;
/** How long a lock lasts. */
export const LOCK_MS = 15 * 60_000;
/** Failures older than this, with no lock running, are forgotten. */
export const FORGET_FAILURES_MS = 60 * 60_000;

/**
 * How long an address must wait after its `failures`-th failure in a row: nothing before the 5th;
 * then 1, 2, 4, 8 and 16 seconds; from the 10th, the 15-minute lock.
 */
export function waitAfterFailures(failures: number): number {
  if (failures < SLOW_DOWN_AFTER) return 0;
  if (failures >= LOCK_AFTER) return LOCK_MS;
  return 1000 * 2 ** (failures - SLOW_DOWN_AFTER);
}

/** Stable `code`s of the accounts problems (shared with the workbench). */
export const AUTH_PROBLEM_CODES = ACCOUNTS_PROBLEM_CODES;

const problem = (status: number, title: string, detail: string, code: string, errors?: FieldError[]) =>
  new HttpProblem(status, title, detail, errors, 'about:blank', code);

/** A person as the API shows them. */
export function toUser(record: UserRecord): User {
  return {
    id: record.id,
    email: record.email,
    name: record.name,
    role: record.role,
    status: record.status,
    organisation: { id: record.organisationId, name: record.organisationName },
    createdAt: record.createdAt.toISOString(),
  };
}

export function permissionsOf(record: UserRecord): Permission[] {
  return [...ROLE_PERMISSIONS[record.role]];
}

/** A session just issued: the answer's body, and the refresh token for the cookie. */
export interface IssuedSession {
  readonly session: Session;
  readonly refreshToken: string;
}

/** Why a token could not identify anyone, as a 401 problem. */
function unauthenticated(detail: string, code: string): HttpProblem {
  return problem(401, 'Unauthorized', detail, code);
}

const WEAK = (error: FieldError) =>
  problem(400, 'Bad Request', `${error.path}: ${error.message}`, AUTH_PROBLEM_CODES.weakPassword, [error]);

/**
 * Signing in and out, sessions and their refresh tokens, password rules and resets. Passwords are
 * only ever held to hash or verify them: they are neither stored nor logged.
 */
export class AuthService {
  private decoy: Promise<string> | undefined;

  constructor(
    private readonly repo: AccountsRepo,
    readonly settings: AuthSettings,
    private readonly clock: Clock,
    private readonly mailer: Mailer,
    private readonly log: (message: string, error?: unknown) => void,
  ) {}

  /** Hashes a password after checking it against the rules; a 400 naming `password` otherwise. */
  async checkAndHashPassword(password: string, email: string): Promise<string> {
    const weakness = passwordWeakness(password, { email });
    if (weakness) throw WEAK(weakness);
    return hashPassword(password, this.settings.passwordCost);
  }

  /**
   * Signs a person in. An address that failed 5 times in a row waits before its next attempt (1, 2,
   * 4, 8, 16 s: answered 429 with `Retry-After`, without checking the password); after 10 it is
   * locked for 15 minutes. Known and unknown addresses are counted, delayed and answered alike, and an
   * unknown one costs a decoy hash, so no answer tells whether an address has an account.
   */
  async signIn(email: string, password: string): Promise<IssuedSession> {
    const now = this.clock.now();
    const failures = this.repo.findFailures(email);
    if (failures?.blockedUntil && failures.blockedUntil.getTime() > now.getTime()) {
      const seconds = Math.ceil((failures.blockedUntil.getTime() - now.getTime()) / 1000);
      const locked = failures.failures >= LOCK_AFTER;
      throw Object.assign(
        problem(
          429,
          'Too Many Requests',
          locked
            ? `Too many failed sign-ins with this address: it is locked for ${Math.ceil(seconds / 60)} more minutes. Reset the password, or wait.`
            : `Too many failed sign-ins with this address. Wait ${seconds} s before trying again.`,
          locked ? AUTH_PROBLEM_CODES.locked : AUTH_PROBLEM_CODES.throttled,
        ),
        { retryAfterSeconds: seconds },
      );
    }

    const credentials = this.repo.findCredentialsByEmail(email);
    const matches = credentials
      ? await verifyPassword(password, credentials.passwordHash)
      : await verifyPassword(password, await this.decoyHash()).then(() => false);
    if (!credentials || !matches) {
      const recent =
        failures !== undefined && now.getTime() - failures.lastFailedAt.getTime() < FORGET_FAILURES_MS;
      const count = (recent ? failures.failures : 0) + 1;
      const wait = waitAfterFailures(count);
      this.repo.saveFailures({
        email,
        failures: count,
        lastFailedAt: now,
        blockedUntil: wait > 0 ? new Date(now.getTime() + wait) : null,
      });
      throw unauthenticated(
        'The e-mail address or the password is not right.',
        AUTH_PROBLEM_CODES.invalidCredentials,
      );
    }
    this.repo.clearFailures(email);
    if (credentials.status !== 'active') {
      throw problem(
        403,
        'Forbidden',
        'This account has been deactivated. Ask an owner of your organisation to reactivate it.',
        AUTH_PROBLEM_CODES.deactivated,
      );
    }
    return this.issueSession(credentials);
  }

  /** Starts a session: a new family of refresh tokens and an access token. */
  async issueSession(user: UserRecord, familyId: string = randomUUID()): Promise<IssuedSession> {
    const now = this.clock.now();
    const { secret, hash } = generateSecret();
    this.repo.insertRefreshToken({
      userId: user.id,
      familyId,
      hash,
      createdAt: now,
      expiresAt: new Date(now.getTime() + REFRESH_TOKEN_TTL_MS),
    });
    return { session: await this.sessionOf(user), refreshToken: secret };
  }

  private async sessionOf(user: UserRecord): Promise<Session> {
    const accessToken = await signAccessToken(
      { userId: user.id, organisationId: user.organisationId, role: user.role },
      this.settings.signingKey,
      this.clock.now(),
    );
    return {
      accessToken,
      expiresInSeconds: ACCESS_TOKEN_TTL_SECONDS,
      user: toUser(user),
      permissions: permissionsOf(user),
    };
  }

  /**
   * Trades a refresh token for a new one of the same family and a new access token. A token already
   * traded is a copy in someone else's hands: the whole family is revoked, and both holders must sign
   * in again.
   */
  async refresh(token: string | undefined): Promise<IssuedSession> {
    const invalid = unauthenticated(
      'The session has ended or is not valid. Sign in again.',
      AUTH_PROBLEM_CODES.refreshInvalid,
    );
    if (token === undefined || token === '') throw invalid;
    const now = this.clock.now();
    const row = this.repo.findRefreshToken(hashSecret(token));
    if (!row || row.revokedAt !== null) throw invalid;
    const reused = () => {
      this.repo.revokeFamily(row.familyId, now);
      return unauthenticated(
        'This session was already renewed elsewhere; every session started with it has been ended. Sign in again.',
        AUTH_PROBLEM_CODES.refreshReused,
      );
    };
    if (row.replacedAt !== null) throw reused();
    if (row.expiresAt.getTime() <= now.getTime()) throw invalid;
    const user = this.repo.findUserById(row.userId);
    if (!user || user.status !== 'active') {
      this.repo.revokeFamily(row.familyId, now);
      throw invalid;
    }
    const replaced = this.repo.markReplaced(row.id, now);
    if (!replaced) throw reused();
    return this.issueSession(user, row.familyId);
  }

  /** Ends the session of a refresh token: its family is revoked. Nothing happens for an unknown one. */
  signOut(token: string | undefined): void {
    if (!token) return;
    const row = this.repo.findRefreshToken(hashSecret(token));
    if (row) this.repo.revokeFamily(row.familyId, this.clock.now());
  }

  /**
   * Identifies the person of an access token, as they are now in the database: deactivated people
   * and changed organisations are refused, and the role is the current one.
   */
  async authenticate(token: string): Promise<UserRecord> {
    const claims = await verifyAccessToken(token, this.settings.signingKey, this.clock.now());
    if (claims === 'expired') {
      throw unauthenticated('The access token has expired; refresh it.', AUTH_PROBLEM_CODES.tokenExpired);
    }
    if (claims === 'invalid') {
      throw unauthenticated('The access token is not valid.', AUTH_PROBLEM_CODES.tokenInvalid);
    }
    const user = this.repo.findUserById(claims.userId);
    if (!user || user.organisationId !== claims.organisationId || user.status !== 'active') {
      throw unauthenticated('The access token is no longer valid.', AUTH_PROBLEM_CODES.tokenInvalid);
    }
    return user;
  }

  /**
   * Sends a reset link when an active account has this address; does nothing otherwise. The caller
   * answers 202 either way, so the answer tells nothing of the address.
   */
  async requestPasswordReset(email: string): Promise<void> {
    const user = this.repo.findCredentialsByEmail(email);
    if (!user || user.status !== 'active') return;
    const now = this.clock.now();
    const { secret, hash } = generateSecret();
    this.repo.insertPasswordReset({
      userId: user.id,
      tokenHash: hash,
      createdAt: now,
      expiresAt: new Date(now.getTime() + PASSWORD_RESET_TTL_MS),
    });
    const url = `${this.settings.publicUrl}/reset-password?token=${secret}`;
    try {
      await this.mailer.send({
        organisationId: user.organisationId,
        to: user.email,
        subject: 'Choose a new Counterpoise password',
        ...composeMail(
          [
            `Hello ${user.name},`,
            'Someone, probably you, asked to choose a new password for your Counterpoise account. ' +
              'The link works once, within the hour. If you did not ask, ignore this message: your ' +
              'password stays as it is.',
          ],
          { label: 'Choose a new password', url },
        ),
      });
    } catch (error) {
      this.log('A password-reset e-mail could not be sent.', error);
    }
  }

  /**
   * Sets a new password with a reset link's token: the token is spent, every session of the person
   * ends, and failed sign-ins are forgotten. A weak password is refused before the token is spent.
   */
  async confirmPasswordReset(token: string, password: string): Promise<void> {
    const now = this.clock.now();
    const linkInvalid = problem(
      400,
      'Bad Request',
      'token: This link is not valid, has expired or was already used. Ask for a new one.',
      AUTH_PROBLEM_CODES.linkInvalid,
      [
        {
          path: 'token',
          message: 'This link is not valid, has expired or was already used. Ask for a new one.',
        },
      ],
    );
    const tokenHash = hashSecret(token);
    const userId = this.repo.findValidPasswordReset(tokenHash, now);
    const user = userId === undefined ? undefined : this.repo.findUserById(userId);
    if (!user || user.status !== 'active') throw linkInvalid;
    const passwordHash = await this.checkAndHashPassword(password, user.email);
    this.repo.transaction(() => {
      const spentBy = this.repo.spendPasswordReset(tokenHash, this.clock.now());
      if (spentBy !== user.id) throw linkInvalid;
      this.repo.setPassword(user.id, passwordHash);
      this.repo.revokeAllOfUser(user.id, now);
      this.repo.clearFailures(user.email);
    });
  }

  private decoyHash(): Promise<string> {
    this.decoy ??= decoyHash(this.settings.passwordCost);
    return this.decoy;
  }
}
