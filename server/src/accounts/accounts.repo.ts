import { and, asc, desc, eq, gt, isNull, ne, type SQL, sql } from 'drizzle-orm';
import type { Role } from '@counterpoise/api';
import type { Orm } from '../db/database';
import {
  invitations,
  organisations,
  passwordResets,
  refreshTokens,
  signInFailures,
  users,
} from '../db/schema';

export type UserStatus = 'active' | 'deactivated';

/** How failed sign-ins of an address are counted and held back (see `waitAfterFailures`). */
export interface SignInFailurePolicy {
  /** The failures in a row from which the wait no longer grows: the lock. */
  readonly lockAfter: number;
  /** How long an address must wait after its n-th failure in a row (0: not at all). */
  readonly waitMs: (failures: number) => number;
  /** Failures whose latest is this old are forgotten: the next attempt counts from one again. */
  readonly forgetMs: number;
}

/** An attempt counted by `countSignInAttempt`: the failures in a row with it, and the wait it sets. */
export interface CountedAttempt {
  readonly failures: number;
  readonly blockedUntil: Date | null;
}

/** A stored person with their organisation's name; the password hash stays in `UserCredentials`. */
export interface UserRecord {
  readonly id: number;
  readonly organisationId: number;
  readonly organisationName: string;
  readonly email: string;
  readonly name: string;
  readonly role: Role;
  readonly status: UserStatus;
  readonly createdAt: Date;
}

export interface UserCredentials extends UserRecord {
  readonly passwordHash: string;
}

export interface InvitationRecord {
  readonly id: number;
  readonly organisationId: number;
  readonly organisationName: string;
  readonly email: string;
  readonly role: Role;
  readonly name: string | null;
  readonly invitedByName: string;
  readonly createdAt: Date;
  readonly expiresAt: Date;
  readonly acceptedAt: Date | null;
  readonly revokedAt: Date | null;
}

const USER_COLUMNS = {
  id: users.id,
  organisationId: users.organisationId,
  organisationName: organisations.name,
  email: users.email,
  name: users.name,
  role: users.role,
  status: users.status,
  createdAt: users.createdAt,
};

const INVITATION_COLUMNS = {
  id: invitations.id,
  organisationId: invitations.organisationId,
  organisationName: organisations.name,
  email: invitations.email,
  role: invitations.role,
  name: invitations.name,
  invitedByName: users.name,
  createdAt: invitations.createdAt,
  expiresAt: invitations.expiresAt,
  acceptedAt: invitations.acceptedAt,
  revokedAt: invitations.revokedAt,
};

/**
 * The Drizzle queries of organisations, people and their sign-in secrets. Every query that reads or
 * changes what belongs to an organisation takes the organisation's id and filters by it, so that an id
 * of another organisation finds nothing (and the route answers 404).
 */
export class AccountsRepo {
  constructor(readonly orm: Orm) {}

  /** Runs `work` in one transaction. */
  transaction<T>(work: () => T): T {
    return this.orm.transaction(work);
  }

  // Organisations

  findOrganisationByName(name: string): { id: number; name: string } | undefined {
    return this.orm
      .select({ id: organisations.id, name: organisations.name })
      .from(organisations)
      .where(eq(organisations.name, name))
      .get();
  }

  insertOrganisation(name: string, now: Date): { id: number; name: string } {
    return this.orm
      .insert(organisations)
      .values({ name, createdAt: now })
      .returning({ id: organisations.id, name: organisations.name })
      .get();
  }

  organisationCount(): number {
    return (
      this.orm
        .select({ count: sql<number>`count(*)` })
        .from(organisations)
        .get()?.count ?? 0
    );
  }

  // People

  private selectUsers() {
    return this.orm
      .select(USER_COLUMNS)
      .from(users)
      .innerJoin(organisations, eq(organisations.id, users.organisationId));
  }

  /** The person with this address, with their password hash, in any organisation (for sign-in). */
  findCredentialsByEmail(email: string): UserCredentials | undefined {
    return this.orm
      .select({ ...USER_COLUMNS, passwordHash: users.passwordHash })
      .from(users)
      .innerJoin(organisations, eq(organisations.id, users.organisationId))
      .where(eq(users.email, email))
      .get();
  }

  /** The person with this id, whatever their organisation: for the signed-in person only. */
  findUserById(id: number): UserRecord | undefined {
    return this.selectUsers().where(eq(users.id, id)).get();
  }

  /** The person with this id in this organisation. */
  findUserInOrganisation(organisationId: number, id: number): UserRecord | undefined {
    return this.selectUsers()
      .where(and(eq(users.organisationId, organisationId), eq(users.id, id)))
      .get();
  }

  emailTaken(email: string): boolean {
    return this.orm.select({ id: users.id }).from(users).where(eq(users.email, email)).get() !== undefined;
  }

  listUsers(organisationId: number): UserRecord[] {
    return this.selectUsers().where(eq(users.organisationId, organisationId)).orderBy(asc(users.id)).all();
  }

  insertUser(row: {
    organisationId: number;
    email: string;
    name: string;
    role: Role;
    passwordHash: string;
    createdAt: Date;
  }): UserRecord {
    const { id } = this.orm
      .insert(users)
      .values({ ...row, status: 'active' })
      .returning({ id: users.id })
      .get();
    return this.findUserById(id)!;
  }

  /** Changes a person's role or status within an organisation; false when no such person is in it. */
  updateUser(organisationId: number, id: number, change: { role?: Role; status?: UserStatus }): boolean {
    return (
      this.orm
        .update(users)
        .set(change)
        .where(and(eq(users.organisationId, organisationId), eq(users.id, id)))
        .run().changes === 1
    );
  }

  setPassword(userId: number, passwordHash: string): void {
    this.orm.update(users).set({ passwordHash }).where(eq(users.id, userId)).run();
  }

  // Failed sign-ins

  findFailures(email: string) {
    return this.orm.select().from(signInFailures).where(eq(signInFailures.email, email)).get();
  }

  /**
   * Counts a sign-in attempt as a failure before its password is checked (a success clears the count
   * afterwards), in one statement: the count goes up by one (from one when the last failure is older
   * than `forgetMs`) and the wait of the new count is set. An address still waiting is left as it is
   * and nothing is returned: the attempt is refused without being counted. Being one statement, it
   * holds however many attempts arrive at once, in this process or another on the same file.
   */
  countSignInAttempt(email: string, now: Date, policy: SignInFailurePolicy): CountedAttempt | undefined {
    const at = now.getTime();
    const blockedUntilAfter = (failures: number): number | null => {
      const wait = policy.waitMs(failures);
      return wait > 0 ? at + wait : null;
    };
    const count = sql`(CASE WHEN ${signInFailures.lastFailedAt} <= ${at - policy.forgetMs} THEN 1 ELSE ${signInFailures.failures} + 1 END)`;
    // The schedule is spelled out from `policy.waitMs` itself, so the statement cannot drift from it.
    const steps: SQL[] = [
      sql`WHEN ${count} >= ${policy.lockAfter} THEN ${blockedUntilAfter(policy.lockAfter)}`,
    ];
    for (let failures = 1; failures < policy.lockAfter; failures++) {
      const until = blockedUntilAfter(failures);
      if (until !== null) steps.push(sql`WHEN ${count} = ${failures} THEN ${until}`);
    }
    const first = blockedUntilAfter(1);
    return this.orm
      .insert(signInFailures)
      .values({
        email,
        failures: 1,
        lastFailedAt: now,
        blockedUntil: first === null ? null : new Date(first),
      })
      .onConflictDoUpdate({
        target: signInFailures.email,
        set: {
          failures: count,
          lastFailedAt: now,
          blockedUntil: sql`(CASE ${sql.join(steps, sql` `)} ELSE NULL END)`,
        },
        setWhere: sql`${signInFailures.blockedUntil} IS NULL OR ${signInFailures.blockedUntil} <= ${at}`,
      })
      .returning({ failures: signInFailures.failures, blockedUntil: signInFailures.blockedUntil })
      .get();
  }

  clearFailures(email: string): void {
    this.orm.delete(signInFailures).where(eq(signInFailures.email, email)).run();
  }

  // Refresh tokens

  insertRefreshToken(row: {
    userId: number;
    familyId: string;
    hash: string;
    createdAt: Date;
    expiresAt: Date;
  }) {
    this.orm.insert(refreshTokens).values(row).run();
  }

  findRefreshToken(hash: string) {
    return this.orm.select().from(refreshTokens).where(eq(refreshTokens.hash, hash)).get();
  }

  /** Marks a token replaced unless it already is; false when another request replaced it first. */
  markReplaced(id: number, at: Date): boolean {
    return (
      this.orm
        .update(refreshTokens)
        .set({ replacedAt: at })
        .where(and(eq(refreshTokens.id, id), isNull(refreshTokens.replacedAt)))
        .run().changes === 1
    );
  }

  revokeFamily(familyId: string, at: Date): void {
    this.orm
      .update(refreshTokens)
      .set({ revokedAt: at })
      .where(and(eq(refreshTokens.familyId, familyId), isNull(refreshTokens.revokedAt)))
      .run();
  }

  revokeAllOfUser(userId: number, at: Date): void {
    this.orm
      .update(refreshTokens)
      .set({ revokedAt: at })
      .where(and(eq(refreshTokens.userId, userId), isNull(refreshTokens.revokedAt)))
      .run();
  }

  // Invitations

  private selectInvitations() {
    return this.orm
      .select(INVITATION_COLUMNS)
      .from(invitations)
      .innerJoin(organisations, eq(organisations.id, invitations.organisationId))
      .innerJoin(users, eq(users.id, invitations.invitedBy));
  }

  insertInvitation(row: {
    organisationId: number;
    email: string;
    role: Role;
    name: string | null;
    invitedBy: number;
    tokenHash: string;
    createdAt: Date;
    expiresAt: Date;
  }): InvitationRecord {
    const { id } = this.orm.insert(invitations).values(row).returning({ id: invitations.id }).get();
    return this.selectInvitations().where(eq(invitations.id, id)).get()!;
  }

  /** Withdraws the open invitations of an address in an organisation (a newer one replaces them). */
  revokeOpenInvitations(organisationId: number, email: string, at: Date): void {
    this.orm
      .update(invitations)
      .set({ revokedAt: at })
      .where(
        and(
          eq(invitations.organisationId, organisationId),
          eq(invitations.email, email),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
        ),
      )
      .run();
  }

  findInvitationByTokenHash(tokenHash: string): InvitationRecord | undefined {
    return this.selectInvitations().where(eq(invitations.tokenHash, tokenHash)).get();
  }

  /** Marks an invitation accepted unless it already is; false when it was spent meanwhile. */
  markInvitationAccepted(id: number, at: Date): boolean {
    return (
      this.orm
        .update(invitations)
        .set({ acceptedAt: at })
        .where(and(eq(invitations.id, id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
        .run().changes === 1
    );
  }

  /** The organisation's invitations not yet accepted nor withdrawn, newest first. */
  listOpenInvitations(organisationId: number): InvitationRecord[] {
    return this.selectInvitations()
      .where(
        and(
          eq(invitations.organisationId, organisationId),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
        ),
      )
      .orderBy(desc(invitations.id))
      .all();
  }

  // Password resets

  insertPasswordReset(row: { userId: number; tokenHash: string; createdAt: Date; expiresAt: Date }): void {
    this.orm.insert(passwordResets).values(row).run();
  }

  /** When the person's latest reset link was issued, if ever. */
  latestPasswordResetAt(userId: number): Date | undefined {
    return this.orm
      .select({ createdAt: passwordResets.createdAt })
      .from(passwordResets)
      .where(eq(passwordResets.userId, userId))
      .orderBy(desc(passwordResets.createdAt), desc(passwordResets.id))
      .limit(1)
      .get()?.createdAt;
  }

  /** Ends every open reset link of a person (but `keep`, if given) by marking it used at `now`. */
  endOpenPasswordResets(userId: number, now: Date, keep?: string): void {
    this.orm
      .update(passwordResets)
      .set({ usedAt: now })
      .where(
        and(
          eq(passwordResets.userId, userId),
          isNull(passwordResets.usedAt),
          keep === undefined ? undefined : ne(passwordResets.tokenHash, keep),
        ),
      )
      .run();
  }

  /** Removes a reset link that never reached its person (its e-mail could not be sent). */
  deletePasswordReset(tokenHash: string): void {
    this.orm.delete(passwordResets).where(eq(passwordResets.tokenHash, tokenHash)).run();
  }

  /** The person of a reset token that is neither spent nor expired. */
  findValidPasswordReset(tokenHash: string, now: Date): number | undefined {
    return this.orm
      .select({ userId: passwordResets.userId })
      .from(passwordResets)
      .where(
        and(
          eq(passwordResets.tokenHash, tokenHash),
          isNull(passwordResets.usedAt),
          gt(passwordResets.expiresAt, now),
        ),
      )
      .get()?.userId;
  }

  /** Spends a valid reset token and returns its person's id; undefined when unknown, spent or expired. */
  spendPasswordReset(tokenHash: string, now: Date): number | undefined {
    return this.orm
      .update(passwordResets)
      .set({ usedAt: now })
      .where(
        and(
          eq(passwordResets.tokenHash, tokenHash),
          isNull(passwordResets.usedAt),
          gt(passwordResets.expiresAt, now),
        ),
      )
      .returning({ userId: passwordResets.userId })
      .get()?.userId;
  }
}
