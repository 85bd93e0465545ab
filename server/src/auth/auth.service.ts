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
import type { AccountsRepo, SignInFailurePolicy, UserRecord } from '../accounts/accounts.repo';
import { BackgroundWork } from './background-work';
import { HashGate, HashGateFull } from './hash-gate';
import { decoyHash, hashPassword, passwordWeakness, type ScryptCost, verifyPassword } from './passwords';
import { TooManyRequests } from './too-many-requests';
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
/**
 * At most one reset e-mail per address in this span: asking again sooner is answered alike (202) and
 * sends nothing, so that nobody can fill a person's mailbox or pile up live links.
 */
export const PASSWORD_RESET_MAIL_INTERVAL_MS = 5 * 60_000;
/**
 * How long the refresh token just replaced still answers, with the same successor: two tabs that
 * refresh at the same moment with one cookie both go on, instead of ending the session as a theft.
 */
export const REFRESH_GRACE_MS = 10_000;

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

/** The slow-down and lock above, as the sign-in counter applies them. */
export const SIGN_IN_FAILURE_POLICY: SignInFailurePolicy = {
  lockAfter: LOCK_AFTER,
  waitMs: waitAfterFailures,
  forgetMs: FORGET_FAILURES_MS,
};

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

/** What the protections of the accounts routes are built from; a default of each when absent. */
export interface AuthProtections {
  /** The gate every password hash passes through. */
  readonly hashGate?: HashGate;
  /** Where the work after an answer runs (reset e-mails). */
  readonly background?: BackgroundWork;
}

/** The successor a refresh gave for a token, kept in memory for `REFRESH_GRACE_MS`. */
interface RecentRefresh {
  readonly successor: string;
  readonly untilMs: number;
}

/**
 * Signing in and out, sessions and their refresh tokens, password rules and resets. Passwords are
 * only ever held to hash or verify them: they are neither stored nor logged.
 */
export class AuthService {
  private decoy: Promise<string> | undefined;
  private readonly hashes: HashGate;
  private readonly background: BackgroundWork;
  /** By the hash of the token replaced: never the secret of a replaced token, only of its successor. */
  private readonly recentRefreshes = new Map<string, RecentRefresh>();

  constructor(
    private readonly repo: AccountsRepo,
    readonly settings: AuthSettings,
    private readonly clock: Clock,
    private readonly mailer: Mailer,
    private readonly log: (message: string, error?: unknown) => void,
    protections: AuthProtections = {},
  ) {
    this.hashes = protections.hashGate ?? new HashGate();
    this.background = protections.background ?? new BackgroundWork(log);
  }

  /**
   * Hashes a password after checking it against the rules; a 400 naming `password` otherwise, a 429
   * when the server is already hashing all it takes.
   */
  async checkAndHashPassword(password: string, email: string): Promise<string> {
    const weakness = passwordWeakness(password, { email });
    if (weakness) throw WEAK(weakness);
    return this.hashes.run(() => hashPassword(password, this.settings.passwordCost));
  }

  /**
   * Signs a person in. An address that failed 5 times in a row waits before its next attempt (1, 2,
   * 4, 8, 16 s: answered 429 with `Retry-After`, without checking the password); after 10 it is
   * locked for 15 minutes. Known and unknown addresses are counted, delayed and answered alike, and an
   * unknown one costs a decoy hash, so no answer tells whether an address has an account.
   *
   * The attempt is counted as a failure before the password is checked, and the count cleared once it
   * proves right: attempts sent at once are each counted, and those past the allowance are refused
   * without a hash. When the server is already hashing all it takes, the attempt is refused (429)
   * before it is counted.
   */
  async signIn(email: string, password: string): Promise<IssuedSession> {
    if (this.hashes.full) throw new HashGateFull();
    const now = this.clock.now();
    const counted = this.repo.countSignInAttempt(email, now, SIGN_IN_FAILURE_POLICY);
    if (counted === undefined) throw this.tooSoon(email, now);

    const credentials = this.repo.findCredentialsByEmail(email);
    // No await between the `full` check and here: the gate has room for this one.
    const matches = await this.hashes.run(async () =>
      credentials
        ? verifyPassword(password, credentials.passwordHash)
        : verifyPassword(password, await this.decoyHash()).then(() => false),
    );
    if (!credentials || !matches) {
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

  /** The 429 of an attempt that came while its address must wait or is locked. */
  private tooSoon(email: string, now: Date): TooManyRequests {
    const failures = this.repo.findFailures(email);
    const blockedMs = (failures?.blockedUntil?.getTime() ?? now.getTime()) - now.getTime();
    const seconds = Math.max(1, Math.ceil(blockedMs / 1000));
    const locked = (failures?.failures ?? 0) >= LOCK_AFTER;
    return new TooManyRequests(
      locked
        ? `Too many failed sign-ins with this address: it is locked for ${Math.ceil(seconds / 60)} more minutes. Reset the password, or wait.`
        : `Too many failed sign-ins with this address. Wait ${seconds} s before trying again.`,
      locked ? AUTH_PROBLEM_CODES.locked : AUTH_PROBLEM_CODES.throttled,
      seconds,
    );
  }

  /** Starts a session: a new family of refresh tokens and an access token. */
  async issueSession(user: UserRecord, familyId: string = randomUUID()): Promise<IssuedSession> {
    const refreshToken = this.storeRefreshToken(user, familyId);
    return { session: await this.sessionOf(user), refreshToken };
  }

  /** Stores a new refresh token of a family and returns its secret. */
  private storeRefreshToken(user: UserRecord, familyId: string): string {
    const now = this.clock.now();
    const { secret, hash } = generateSecret();
    this.repo.insertRefreshToken({
      userId: user.id,
      familyId,
      hash,
      createdAt: now,
      expiresAt: new Date(now.getTime() + REFRESH_TOKEN_TTL_MS),
    });
    return secret;
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
   * in again. Except within `REFRESH_GRACE_MS` of its trade, while its successor is still unused: then
   * it answers that same successor again (with a fresh access token), because two tabs of one browser
   * refreshing at the same moment with one cookie are not a theft.
   */
  async refresh(token: string | undefined): Promise<IssuedSession> {
    const invalid = unauthenticated(
      'The session has ended or is not valid. Sign in again.',
      AUTH_PROBLEM_CODES.refreshInvalid,
    );
    if (token === undefined || token === '') throw invalid;
    const now = this.clock.now();
    this.forgetOldRefreshes(now);
    const tokenHash = hashSecret(token);
    const row = this.repo.findRefreshToken(tokenHash);
    if (!row || row.revokedAt !== null) throw invalid;
    const reused = () => {
      this.repo.revokeFamily(row.familyId, now);
      return unauthenticated(
        'This session was already renewed elsewhere; every session started with it has been ended. Sign in again.',
        AUTH_PROBLEM_CODES.refreshReused,
      );
    };
    if (row.replacedAt !== null) {
      const again = this.successorInGrace(tokenHash, now);
      if (again === undefined) throw reused();
      return { session: await this.sessionOf(again.user), refreshToken: again.successor };
    }
    if (row.expiresAt.getTime() <= now.getTime()) throw invalid;
    const user = this.repo.findUserById(row.userId);
    if (!user || user.status !== 'active') {
      this.repo.revokeFamily(row.familyId, now);
      throw invalid;
    }
    const replaced = this.repo.markReplaced(row.id, now);
    if (!replaced) throw reused();
    // Stored and remembered before the first await, so that a second refresh with the same token,
    // however soon, finds both.
    const successor = this.storeRefreshToken(user, row.familyId);
    this.recentRefreshes.set(tokenHash, { successor, untilMs: now.getTime() + REFRESH_GRACE_MS });
    return { session: await this.sessionOf(user), refreshToken: successor };
  }

  /** The successor given for a replaced token, while its grace lasts and it is still usable. */
  private successorInGrace(
    tokenHash: string,
    now: Date,
  ): { successor: string; user: UserRecord } | undefined {
    const recent = this.recentRefreshes.get(tokenHash);
    if (recent === undefined || recent.untilMs <= now.getTime()) return undefined;
    const next = this.repo.findRefreshToken(hashSecret(recent.successor));
    if (!next || next.revokedAt !== null || next.replacedAt !== null) return undefined;
    if (next.expiresAt.getTime() <= now.getTime()) return undefined;
    const user = this.repo.findUserById(next.userId);
    if (!user || user.status !== 'active') return undefined;
    return { successor: recent.successor, user };
  }

  private forgetOldRefreshes(now: Date): void {
    for (const [tokenHash, recent] of this.recentRefreshes) {
      if (recent.untilMs <= now.getTime()) this.recentRefreshes.delete(tokenHash);
    }
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
   * Takes a request for a reset link and returns at once: the caller answers 202 before anything is
   * looked up, so neither the answer nor its time tells whether the address has an account. After the
   * answer, an active account with this address gets a link, unless it got one less than
   * `PASSWORD_RESET_MAIL_INTERVAL_MS` ago; the new link ends every older one.
   */
  requestPasswordReset(email: string): void {
    this.background.start('A password-reset e-mail could not be sent.', () => this.sendPasswordReset(email));
  }

  private async sendPasswordReset(email: string): Promise<void> {
    const now = this.clock.now();
    // One transaction without an await: requests for one address that arrive together issue one link.
    const issued = this.repo.transaction(() => {
      const user = this.repo.findCredentialsByEmail(email);
      if (!user || user.status !== 'active') return undefined;
      const latest = this.repo.latestPasswordResetAt(user.id);
      if (latest && now.getTime() - latest.getTime() < PASSWORD_RESET_MAIL_INTERVAL_MS) return undefined;
      this.repo.endOpenPasswordResets(user.id, now);
      const { secret, hash } = generateSecret();
      this.repo.insertPasswordReset({
        userId: user.id,
        tokenHash: hash,
        createdAt: now,
        expiresAt: new Date(now.getTime() + PASSWORD_RESET_TTL_MS),
      });
      return { user, secret, hash };
    });
    if (issued === undefined) return;
    const { user, secret, hash } = issued;
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
      // A link that reached nobody must not hold back the next request for one.
      this.repo.deletePasswordReset(hash);
      throw error;
    }
  }

  /**
   * Sets a new password with a reset link's token: the token is spent with every other open link of
   * the person, every session of the person ends, and failed sign-ins are forgotten. A weak password
   * is refused before the token is spent.
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
      this.repo.endOpenPasswordResets(user.id, now);
      this.repo.setPassword(user.id, passwordHash);
      this.repo.revokeAllOfUser(user.id, now);
      this.repo.clearFailures(user.email);
    });
  }

  /** Computed once, inside the gate place of the first unknown address that needs it. */
  private decoyHash(): Promise<string> {
    this.decoy ??= decoyHash(this.settings.passwordCost).catch((error: unknown) => {
      this.decoy = undefined;
      throw error;
    });
    return this.decoy;
  }
}
