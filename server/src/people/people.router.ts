import {
  AcceptInvitationSchema,
  InvitationPreviewSchema,
  InvitationSchema,
  InviteRequestSchema,
  PeopleSchema,
  SessionSchema,
  UpdatePersonSchema,
  UserSchema,
} from '@counterpoise/api';
import type { Response } from 'express';
import { SESSION_EXAMPLE, USER_EXAMPLE } from '../auth/auth.examples';
import {
  CROSS_SITE_RESPONSE,
  PASSWORD_CHECKS_BUSY,
  RETRY_AFTER_HEADER,
  sendSession,
} from '../auth/auth.router';
import type { AuthService } from '../auth/auth.service';
import { type ClientLimits, clientLimiter, defaultLimitInWords } from '../auth/client-limits';
import { refuseCrossSite } from '../auth/same-origin';
import { IdParamSchema, TokenParamSchema } from '../http/params';
import { type AccessRule, type FeatureRoutes, RouteTable } from '../http/route';
import { problemResponse, SET_COOKIE_HEADER } from '../openapi/responses';
import type { UserRecord } from '../accounts/accounts.repo';
import {
  ACCEPT_INVITATION_EXAMPLE,
  INVITATION_EXAMPLE,
  INVITATION_PREVIEW_EXAMPLE,
  INVITE_EXAMPLE,
  PEOPLE_EXAMPLE,
  UPDATE_PERSON_EXAMPLE,
} from './people.examples';
import type { PeopleService } from './people.service';

/**
 * Who may call a people route, as the app maps it: `read` the people (`people:read`), `invite`
 * (`people:invite`), `manage` a person (`people:manage`, or `people:invite` for the service's narrower
 * rule of managers), and `link`: anyone holding an invitation link, whose token is the credential.
 */
export type PeopleAccess = 'read' | 'invite' | 'manage' | 'link';

/** The signed-in person of a request that passed the guard. */
function actorOf(res: Response): UserRecord {
  const user = res.locals.user;
  if (user === undefined) throw new Error('The people routes run behind requireUser.');
  return user;
}

const NO_INVITATION = 'No invitation has this token.';
const INVITATION_GONE = 'The invitation was accepted, replaced or has expired.';

/** The people routes and the invitation links, mounted on `/api/v1`; who may call what comes from the app. */
export function peopleRoutes(deps: {
  auth: AuthService;
  people: PeopleService;
  access: Readonly<Record<PeopleAccess, AccessRule>>;
  /** The per-client limits (invitations accepted); the defaults for those left out. */
  clientLimits?: Partial<ClientLimits>;
}): FeatureRoutes {
  const { auth, people } = deps;
  const table = new RouteTable({ basePath: '/api/v1', tag: 'People', access: deps.access });
  table
    .add<undefined, undefined, undefined, typeof PeopleSchema>({
      method: 'get',
      path: '/people',
      summary: 'The people of the organisation and its open invitations',
      access: 'read',
      answer: {
        status: 200,
        description: 'Everyone, oldest first, and the invitations not yet accepted.',
        schema: PeopleSchema,
        example: PEOPLE_EXAMPLE,
      },
      handle: ({ res }) => {
        res.set('Cache-Control', 'no-store');
        return people.list(actorOf(res));
      },
    })
    .add<undefined, undefined, typeof InviteRequestSchema, typeof InvitationSchema>({
      method: 'post',
      path: '/people/invitations',
      summary: 'Invite someone by e-mail with a role',
      description:
        'Owners invite any role, managers technicians and viewers. The e-mail carries a link to ' +
        '`/accept-invitation` that works once, for 7 days; a newer invitation to the same address ' +
        'replaces the open one.',
      access: 'invite',
      body: InviteRequestSchema,
      bodyExample: INVITE_EXAMPLE,
      answer: {
        status: 201,
        description: 'Invited; the e-mail is sent.',
        schema: InvitationSchema,
        example: INVITATION_EXAMPLE,
      },
      problems: {
        409: 'The address already has an account (`code`: `EMAIL_TAKEN`, `errors` on `email`).',
        502: 'The invitation is saved but its e-mail could not be sent (`code`: `MAIL_NOT_SENT`).',
      },
      handle: async ({ body, res }) => people.invite(actorOf(res), body),
    })
    .add<typeof IdParamSchema, undefined, typeof UpdatePersonSchema, typeof UserSchema>({
      method: 'patch',
      path: '/people/{id}',
      summary: "Change a person's role or status",
      description:
        'Owners change the role and status of anyone but themselves; managers deactivate or reactivate ' +
        'technicians and viewers only. Deactivating ends the person’s sessions. A person of another ' +
        'organisation is not found (404). The role and status of both people are read again when the ' +
        'change is made: an actor whose role or status changed meanwhile is refused (403), so two owners ' +
        'demoting each other at once leave one owner.',
      access: 'manage',
      params: IdParamSchema,
      body: UpdatePersonSchema,
      bodyExample: UPDATE_PERSON_EXAMPLE,
      answer: {
        status: 200,
        description: 'The person as changed.',
        schema: UserSchema,
        example: { ...USER_EXAMPLE, status: 'deactivated' },
      },
      problems: {
        404: 'No such person in the organisation.',
        409: 'A change of one’s own role or status (`code`: `OWN_ACCOUNT`).',
      },
      handle: ({ params, body, res }) => people.update(actorOf(res), params.id, body),
    })
    .add<typeof TokenParamSchema, undefined, undefined, typeof InvitationPreviewSchema>({
      method: 'get',
      path: '/invitations/{token}',
      summary: 'What an invitation link invites to',
      description: 'Needs no sign-in: the token of the link is the credential.',
      access: 'link',
      params: TokenParamSchema,
      answer: {
        status: 200,
        description: 'The invitation.',
        schema: InvitationPreviewSchema,
        example: INVITATION_PREVIEW_EXAMPLE,
      },
      problems: { 404: NO_INVITATION, 410: INVITATION_GONE },
      handle: ({ params, res }) => {
        res.set('Cache-Control', 'no-store');
        return people.preview(params.token);
      },
    })
    .add<typeof TokenParamSchema, undefined, typeof AcceptInvitationSchema, typeof SessionSchema>({
      method: 'post',
      path: '/invitations/{token}/accept',
      summary: 'Accept an invitation: choose a name and a password, and sign in',
      description:
        'Creates the person with the invitation’s role, spends the link, and signs them in. Limited per ' +
        `client address (${defaultLimitInWords('invitationAccept')} by default).`,
      access: 'link',
      params: TokenParamSchema,
      before: [
        refuseCrossSite(auth.settings.publicUrl),
        clientLimiter('invitationAccept', deps.clientLimits),
      ],
      body: AcceptInvitationSchema,
      bodyExample: ACCEPT_INVITATION_EXAMPLE,
      answer: {
        status: 201,
        description: 'Signed in.',
        schema: SessionSchema,
        example: SESSION_EXAMPLE,
        headers: SET_COOKIE_HEADER,
      },
      problems: {
        400: 'The body does not fit, or the password breaks a rule (`errors` on `password`).',
        403: CROSS_SITE_RESPONSE,
        404: NO_INVITATION,
        409: 'The address already has an account (`code`: `EMAIL_TAKEN`).',
        410: INVITATION_GONE,
        429: problemResponse(
          `Too many invitations accepted from this client address (\`code\`: \`CLIENT_THROTTLED\`), or ${PASSWORD_CHECKS_BUSY}.`,
          RETRY_AFTER_HEADER,
        ),
      },
      handle: async ({ params, body, res }) => {
        sendSession(res, await people.accept(params.token, body), auth.settings.secureCookie, 201);
        return undefined;
      },
    });
  return table;
}
