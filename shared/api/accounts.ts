import * as z from 'zod';
import { ApiKeySummarySchema, displayName } from './keys';
import { UsageReportSchema } from './usage';

/*
 * Organisations, people, sign-in and invitations: the contract between the server and the workbench.
 * Every route is under /api/v1; the access token travels as `Authorization: Bearer <token>`, the refresh
 * token only in the httpOnly cookie `REFRESH_COOKIE` scoped to /api/v1/auth.
 */

/** The roles a person can hold in an organisation, from the most to the least powerful. */
export const ROLES = ['owner', 'manager', 'technician', 'developer', 'viewer'] as const;
export type Role = (typeof ROLES)[number];
export const RoleSchema = z
  .enum(ROLES, { error: `role is one of ${ROLES.join(', ')}.` })
  .meta({ id: 'Role' });

/** What a role may do; the server enforces it on every route, the workbench only hides what it forbids. */
export const PERMISSIONS = [
  'organisation:manage',
  'people:read',
  'people:invite',
  'people:manage',
  'jobs:read',
  'jobs:write',
  'jobs:write-any',
  'records:read',
  'machines:write',
  'customers:write',
  'families:write',
  'records:archive',
  'reports:read',
  'keys:manage',
  'usage:read',
  'outbox:read',
  'docs:read',
  'calc:use',
] as const;
export type Permission = (typeof PERMISSIONS)[number];

/** The permissions of each role (see DEVELOPERS.md, "Roles"). */
export const ROLE_PERMISSIONS: Readonly<Record<Role, readonly Permission[]>> = {
  owner: PERMISSIONS,
  manager: [
    'people:read',
    'people:invite',
    'jobs:read',
    'jobs:write',
    'jobs:write-any',
    'records:read',
    'machines:write',
    'customers:write',
    'families:write',
    'records:archive',
    'reports:read',
    'docs:read',
    'calc:use',
  ],
  technician: [
    'jobs:read',
    'jobs:write',
    'records:read',
    'machines:write',
    'customers:write',
    'reports:read',
    'docs:read',
    'calc:use',
  ],
  developer: ['keys:manage', 'usage:read', 'docs:read', 'calc:use'],
  viewer: ['jobs:read', 'records:read', 'reports:read', 'calc:use'],
};

/** The roles a manager may invite; owners may invite any role. */
export const MANAGER_INVITABLE_ROLES: readonly Role[] = ['technician', 'viewer'];

/** Whether a role holds a permission. */
export function can(role: Role, permission: Permission): boolean {
  return ROLE_PERMISSIONS[role].includes(permission);
}

/** The httpOnly, SameSite=Strict cookie that carries the refresh token. */
export const REFRESH_COOKIE = 'cp_refresh';

/**
 * Password rules after NIST SP 800-63B: length, not composition. At least 15 characters for a password
 * that is the only factor, at most 128, any characters (spaces and emoji included), and not one of the
 * commonly used passwords (checked on the server against its list).
 */
export const PASSWORD_MIN_LENGTH = 15;
export const PASSWORD_MAX_LENGTH = 128;
export const PasswordSchema = z
  .string({ error: 'Enter a password.' })
  .min(PASSWORD_MIN_LENGTH, {
    error: `Use at least ${PASSWORD_MIN_LENGTH} characters; a few words in a row make a strong password.`,
  })
  .max(PASSWORD_MAX_LENGTH, { error: `Use at most ${PASSWORD_MAX_LENGTH} characters.` });

export const EmailSchema = z
  .email({ error: 'Enter an e-mail address such as name@example.com.' })
  .max(254)
  .transform((email) => email.toLowerCase());

/** A person's name, as their colleagues see it in the workbench and the CLI lists it. */
export const PersonNameSchema = displayName({ field: 'the name', maxLength: 100, missing: 'Enter a name.' });

/** An organisation's name (a dealer or service shop), as its people and the CLI see it. */
export const OrganisationNameSchema = displayName({
  field: 'the name of an organisation',
  maxLength: 100,
  missing: 'Name the organisation.',
});

/** A person as the API shows them. */
export const UserSchema = z
  .object({
    id: z.number().int().positive(),
    email: z.string(),
    name: z.string(),
    role: RoleSchema,
    status: z.enum(['active', 'deactivated']),
    organisation: z.object({ id: z.number().int().positive(), name: z.string() }),
    createdAt: z.iso.datetime(),
  })
  .meta({ id: 'User' });
export type User = z.infer<typeof UserSchema>;

/** `POST /api/v1/auth/sign-in`. */
export const SignInRequestSchema = z
  .strictObject({
    email: EmailSchema,
    password: z.string({ error: 'Enter your password.' }).min(1).max(1024),
  })
  .meta({ id: 'SignInRequest' });

/** The answer of sign-in, refresh and accepting an invitation (the refresh cookie comes with it). */
export const SessionSchema = z
  .object({
    accessToken: z.string().meta({ description: 'A short-lived JWT for `Authorization: Bearer`.' }),
    expiresInSeconds: z.number().int().positive(),
    user: UserSchema,
    permissions: z.array(z.enum(PERMISSIONS)),
  })
  .meta({ id: 'Session' });
export type Session = z.infer<typeof SessionSchema>;

/** `GET /api/v1/me`. */
export const MeSchema = z
  .object({ user: UserSchema, permissions: z.array(z.enum(PERMISSIONS)) })
  .meta({ id: 'Me' });
export type Me = z.infer<typeof MeSchema>;

/** `POST /api/v1/auth/password-reset`: always 202, whether or not the address is known. */
export const PasswordResetRequestSchema = z
  .strictObject({ email: EmailSchema })
  .meta({ id: 'PasswordResetRequest' });

/** `POST /api/v1/auth/password-reset/confirm`: 204. */
export const PasswordResetConfirmSchema = z
  .strictObject({ token: z.string().min(1).max(200), password: PasswordSchema })
  .meta({ id: 'PasswordResetConfirm' });

/** `POST /api/v1/people/invitations` (owner: any role; manager: technician or viewer). */
export const InviteRequestSchema = z
  .strictObject({ email: EmailSchema, role: RoleSchema, name: PersonNameSchema.optional() })
  .meta({ id: 'InviteRequest' });

/** A pending invitation as people managers see it. */
export const InvitationSchema = z
  .object({
    id: z.number().int().positive(),
    email: z.string(),
    role: RoleSchema,
    invitedBy: z.string(),
    expiresAt: z.iso.datetime(),
    acceptedAt: z.iso.datetime().nullable(),
  })
  .meta({ id: 'Invitation' });

/** `GET /api/v1/invitations/{token}` (no sign-in): what the link invites to. */
export const InvitationPreviewSchema = z
  .object({ email: z.string(), role: RoleSchema, organisationName: z.string(), expiresAt: z.iso.datetime() })
  .meta({ id: 'InvitationPreview' });

/** `POST /api/v1/invitations/{token}/accept`: answers a Session and sets the refresh cookie. */
export const AcceptInvitationSchema = z
  .strictObject({ name: PersonNameSchema, password: PasswordSchema })
  .meta({ id: 'AcceptInvitation' });

/** `GET /api/v1/people`. */
export const PeopleSchema = z
  .object({ people: z.array(UserSchema), invitations: z.array(InvitationSchema) })
  .meta({ id: 'People' });

/** `PATCH /api/v1/people/{id}` (owner; a manager only for technicians and viewers, and only status). */
export const UpdatePersonSchema = z
  .strictObject({ role: RoleSchema.optional(), status: z.enum(['active', 'deactivated']).optional() })
  .refine((body) => body.role !== undefined || body.status !== undefined, {
    error: 'Change the role, the status, or both.',
  })
  .meta({ id: 'UpdatePerson' });

/**
 * What stands in the Outbox for the secret of a link (`/reset-password?token=••••••`): the local mail
 * server keeps no link that works, so that whoever reads the database or the Outbox cannot take over
 * the account the link was for.
 */
export const MASKED_SECRET = '••••••';

/**
 * A file an e-mail carried, as the Outbox lists it; `GET /api/v1/outbox/{messageId}/attachments/{id}` opens
 * it.
 */
export const OutboxAttachmentSchema = z
  .object({
    id: z.number().int().positive(),
    filename: z.string(),
    contentType: z.string(),
    byteSize: z.number().int().nonnegative(),
  })
  .meta({ id: 'OutboxAttachment' });
export type OutboxAttachment = z.infer<typeof OutboxAttachmentSchema>;

/** One e-mail the local SMTP server captured, as the Outbox shows it (`GET /api/v1/outbox`, owner). */
export const OutboxMessageSchema = z
  .object({
    id: z.number().int().positive(),
    from: z.string(),
    to: z.array(z.string()),
    subject: z.string(),
    text: z
      .string()
      .meta({ description: `The plain text, each link's secret replaced by \`${MASKED_SECRET}\`.` }),
    html: z.string().nullable().meta({ description: 'Not kept: always null.' }),
    receivedAt: z.iso.datetime(),
    /** The files the message carried (a service report's PDF), each opened by its own route. */
    attachments: z.array(OutboxAttachmentSchema),
  })
  .meta({ id: 'OutboxMessage' });
export const OutboxSchema = z.object({ messages: z.array(OutboxMessageSchema) }).meta({ id: 'Outbox' });

/** `GET /api/v1/keys` (owner, developer): the organisation's keys. `POST` answers the key once. */
export const ApiKeyListSchema = z.object({ keys: z.array(ApiKeySummarySchema) }).meta({ id: 'ApiKeyList' });
export const CreatedApiKeySchema = z
  .object({
    key: z.string().meta({ description: 'The whole key. It is shown this once and never again.' }),
    summary: ApiKeySummarySchema,
  })
  .meta({ id: 'CreatedApiKey' });

/**
 * `GET /api/v1/usage` asked by a signed-in owner or developer (`usage:read`): the usage of every API key
 * of their organisation, in the groups and totals of the key's own report.
 */
export const OrganisationUsageReportSchema = UsageReportSchema.omit({ key: true })
  .extend({
    organisation: z
      .object({ id: z.number().int().positive(), name: z.string() })
      .meta({ description: 'The organisation whose keys the report covers.' }),
  })
  .meta({
    id: 'OrganisationUsageReport',
    description: 'How much the API keys of the caller’s organisation used the API over a span.',
    example: {
      organisation: { id: 1, name: 'Ridgeline Rotor Service' },
      from: '2026-05-01T00:00:00.000Z',
      to: '2026-05-02T00:00:00.000Z',
      groupBy: 'key',
      groups: [
        {
          group: 'cpk_Q2xvY2s5',
          keyName: 'Dealer portal',
          requests: 1150,
          calculations: 1200,
          clientErrors: 14,
          serverErrors: 0,
          rateLimited: 2,
          errorsByStatus: [
            { status: 422, answers: 12 },
            { status: 429, answers: 2 },
          ],
          bytes: 402_000,
          meanDurationMs: 0.84,
          maxDurationMs: 12.5,
        },
      ],
      total: {
        requests: 1150,
        calculations: 1200,
        clientErrors: 14,
        serverErrors: 0,
        rateLimited: 2,
        errorsByStatus: [
          { status: 422, answers: 12 },
          { status: 429, answers: 2 },
        ],
        bytes: 402_000,
        meanDurationMs: 0.84,
        maxDurationMs: 12.5,
      },
    },
  });
export type OrganisationUsageReport = z.infer<typeof OrganisationUsageReportSchema>;

/** The stable `code`s of the accounts problems, for the workbench and scripts to act on. */
export const ACCOUNTS_PROBLEM_CODES = {
  invalidCredentials: 'INVALID_CREDENTIALS',
  throttled: 'SIGN_IN_THROTTLED',
  locked: 'SIGN_IN_LOCKED',
  deactivated: 'ACCOUNT_DEACTIVATED',
  signInRequired: 'SIGN_IN_REQUIRED',
  tokenExpired: 'TOKEN_EXPIRED',
  tokenInvalid: 'TOKEN_INVALID',
  refreshInvalid: 'REFRESH_INVALID',
  refreshReused: 'REFRESH_REUSED',
  forbidden: 'FORBIDDEN',
  weakPassword: 'WEAK_PASSWORD',
  linkInvalid: 'LINK_INVALID',
  emailTaken: 'EMAIL_TAKEN',
  ownAccount: 'OWN_ACCOUNT',
  mailNotSent: 'MAIL_NOT_SENT',
  clientThrottled: 'CLIENT_THROTTLED',
  passwordChecksBusy: 'PASSWORD_CHECKS_BUSY',
  crossSite: 'CROSS_SITE_REQUEST',
} as const;
