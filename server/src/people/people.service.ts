import type * as z from 'zod';
import {
  type AcceptInvitationSchema,
  can,
  type FieldError,
  type InvitationPreviewSchema,
  type InvitationSchema,
  type InviteRequestSchema,
  invitableRoles,
  MANAGER_INVITABLE_ROLES,
  mayChangeRole,
  mayChangeStatus,
  type PeopleSchema,
  type UpdatePersonSchema,
  type User,
} from '@counterpoise/api';
import type { AccountsRepo, InvitationRecord, UserRecord } from '../accounts/accounts.repo';
import { AUTH_PROBLEM_CODES, type AuthService, type IssuedSession, toUser } from '../auth/auth.service';
import { generateSecret, hashSecret } from '../auth/tokens';
import type { Clock } from '../clock';
import { HttpProblem } from '../http/problem';
import { composeMail, type Mailer } from '../mail/mailer';

/** How long an invitation link works. */
export const INVITATION_TTL_MS = 7 * 24 * 3_600_000;

type Invitation = z.output<typeof InvitationSchema>;

const refuse = (status: number, title: string, code: string, error: FieldError) =>
  new HttpProblem(status, title, `${error.path}: ${error.message}`, [error], 'about:blank', code);

function toInvitation(record: InvitationRecord): Invitation {
  return {
    id: record.id,
    email: record.email,
    role: record.role,
    invitedBy: record.invitedByName,
    expiresAt: record.expiresAt.toISOString(),
    acceptedAt: record.acceptedAt?.toISOString() ?? null,
  };
}

/** The people of an organisation, their invitations, roles and status. */
export class PeopleService {
  constructor(
    private readonly repo: AccountsRepo,
    private readonly auth: AuthService,
    private readonly clock: Clock,
    private readonly mailer: Mailer,
  ) {}

  /** Everyone in the actor's organisation, and the invitations still open. */
  list(actor: UserRecord): z.output<typeof PeopleSchema> {
    return {
      people: this.repo.listUsers(actor.organisationId).map(toUser),
      invitations: this.repo.listOpenInvitations(actor.organisationId).map(toInvitation),
    };
  }

  /**
   * Invites someone by e-mail with a role: owners any role, managers technicians and viewers. A newer
   * invitation to the same address replaces the open one. The e-mail carries a single-use link to
   * `/accept-invitation` that works for 7 days.
   */
  async invite(actor: UserRecord, request: z.output<typeof InviteRequestSchema>): Promise<Invitation> {
    const invitable = invitableRoles(actor.role);
    if (!invitable.includes(request.role)) {
      throw refuse(403, 'Forbidden', AUTH_PROBLEM_CODES.forbidden, {
        path: 'role',
        message: `A ${actor.role} may invite ${invitable.join(' or ')} only.`,
      });
    }
    if (this.repo.emailTaken(request.email)) {
      throw refuse(409, 'Conflict', 'EMAIL_TAKEN', {
        path: 'email',
        message: 'This address already has a Counterpoise account.',
      });
    }
    const now = this.clock.now();
    const { secret, hash } = generateSecret();
    const invitation = this.repo.transaction(() => {
      this.repo.revokeOpenInvitations(actor.organisationId, request.email, now);
      return this.repo.insertInvitation({
        organisationId: actor.organisationId,
        email: request.email,
        role: request.role,
        name: request.name ?? null,
        invitedBy: actor.id,
        tokenHash: hash,
        createdAt: now,
        expiresAt: new Date(now.getTime() + INVITATION_TTL_MS),
      });
    });
    const url = `${this.auth.settings.publicUrl}/accept-invitation?token=${secret}`;
    try {
      await this.mailer.send({
        organisationId: actor.organisationId,
        to: request.email,
        subject: `${actor.name} invites you to ${actor.organisationName} on Counterpoise`,
        ...composeMail(
          [
            request.name ? `Hello ${request.name},` : 'Hello,',
            `${actor.name} invites you to join ${actor.organisationName} on Counterpoise as ${request.role}. ` +
              `Open the link to choose your password; it works once, until ${invitation.expiresAt.toUTCString()}.`,
          ],
          { label: 'Accept the invitation', url },
        ),
      });
    } catch {
      throw new HttpProblem(
        502,
        'Bad Gateway',
        'The invitation is saved, but its e-mail could not be sent. Invite the address again to resend it.',
        undefined,
        'about:blank',
        'MAIL_NOT_SENT',
      );
    }
    return toInvitation(invitation);
  }

  /** The open invitation of a link's token: 404 when unknown, 410 when spent, withdrawn or expired. */
  private openInvitation(token: string): InvitationRecord {
    const invitation = this.repo.findInvitationByTokenHash(hashSecret(token));
    if (!invitation) {
      throw new HttpProblem(
        404,
        'Not Found',
        'This invitation link is not valid.',
        undefined,
        'about:blank',
        AUTH_PROBLEM_CODES.linkInvalid,
      );
    }
    const gone =
      invitation.acceptedAt !== null
        ? 'This invitation was already accepted. Sign in instead.'
        : invitation.revokedAt !== null
          ? 'This invitation was replaced by a newer one. Use the link of the latest e-mail.'
          : invitation.expiresAt.getTime() <= this.clock.now().getTime()
            ? 'This invitation has expired. Ask for a new one.'
            : null;
    if (gone)
      throw new HttpProblem(410, 'Gone', gone, undefined, 'about:blank', AUTH_PROBLEM_CODES.linkInvalid);
    return invitation;
  }

  /** What a link invites to, for the page that accepts it. */
  preview(token: string): z.output<typeof InvitationPreviewSchema> {
    const invitation = this.openInvitation(token);
    return {
      email: invitation.email,
      role: invitation.role,
      organisationName: invitation.organisationName,
      expiresAt: invitation.expiresAt.toISOString(),
    };
  }

  /** Accepts an invitation: the person is created with its role and signed in. */
  async accept(token: string, body: z.output<typeof AcceptInvitationSchema>): Promise<IssuedSession> {
    const invitation = this.openInvitation(token);
    if (this.repo.emailTaken(invitation.email)) {
      throw new HttpProblem(
        409,
        'Conflict',
        'This address already has a Counterpoise account. Sign in instead.',
        undefined,
        'about:blank',
        'EMAIL_TAKEN',
      );
    }
    const passwordHash = await this.auth.checkAndHashPassword(body.password, invitation.email);
    const now = this.clock.now();
    const user = this.repo.transaction(() => {
      if (!this.repo.markInvitationAccepted(invitation.id, now) || this.repo.emailTaken(invitation.email)) {
        throw new HttpProblem(
          410,
          'Gone',
          'This invitation was accepted meanwhile. Sign in instead.',
          undefined,
          'about:blank',
          AUTH_PROBLEM_CODES.linkInvalid,
        );
      }
      return this.repo.insertUser({
        organisationId: invitation.organisationId,
        email: invitation.email,
        name: body.name,
        role: invitation.role,
        passwordHash,
        createdAt: now,
      });
    });
    return this.auth.issueSession(user);
  }

  /**
   * Changes a person's role or status. Owners change anyone's but their own; managers only deactivate
   * or reactivate technicians and viewers. Deactivating ends the person's sessions. Someone of another
   * organisation is not found.
   *
   * The rules are checked inside the change's transaction against the actor and the person as they
   * are then, not as the access token found them a moment earlier: of two owners who demote or
   * deactivate each other at the same moment, the second is no longer an owner when their change is
   * made, and is refused (403). As nobody changes themselves, the actor of any change of an owner stays
   * an active owner: the organisation keeps one.
   */
  update(actor: UserRecord, id: number, change: z.output<typeof UpdatePersonSchema>): User {
    const field = change.role !== undefined ? 'role' : 'status';
    const now = this.clock.now();
    return this.repo.transaction(() => {
      const person = this.repo.findUserInOrganisation(actor.organisationId, id);
      if (!person) throw new HttpProblem(404, 'Not Found', `No person ${id} in your organisation.`);
      if (person.id === actor.id) {
        throw refuse(409, 'Conflict', AUTH_PROBLEM_CODES.ownAccount, {
          path: field,
          message: 'You cannot change your own role or status; ask another owner.',
        });
      }
      const current = this.repo.findUserInOrganisation(actor.organisationId, actor.id);
      if (!current || current.status !== 'active') {
        throw refuse(403, 'Forbidden', AUTH_PROBLEM_CODES.forbidden, {
          path: field,
          message: 'Your account was deactivated meanwhile.',
        });
      }
      // The shared rules decide, as the workbench does when it offers the change; the messages say why.
      const allowed =
        (change.role === undefined || mayChangeRole(current, person)) &&
        (change.status === undefined || mayChangeStatus(current, person));
      if (!allowed) {
        if (!can(current.role, 'people:invite')) {
          throw refuse(403, 'Forbidden', AUTH_PROBLEM_CODES.forbidden, {
            path: field,
            message: `Your role was changed to ${current.role} meanwhile; it may not change people.`,
          });
        }
        if (change.role !== undefined) {
          throw refuse(403, 'Forbidden', AUTH_PROBLEM_CODES.forbidden, {
            path: 'role',
            message: 'Only an owner changes roles.',
          });
        }
        throw refuse(403, 'Forbidden', AUTH_PROBLEM_CODES.forbidden, {
          path: 'status',
          message: `A ${current.role} changes the status of ${MANAGER_INVITABLE_ROLES.join(' and ')} people only.`,
        });
      }
      this.repo.updateUser(actor.organisationId, id, {
        ...(change.role === undefined ? {} : { role: change.role }),
        ...(change.status === undefined ? {} : { status: change.status }),
      });
      if (change.status === 'deactivated') this.repo.revokeAllOfUser(id, now);
      return toUser(this.repo.findUserInOrganisation(actor.organisationId, id)!);
    });
  }
}
