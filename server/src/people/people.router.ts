import { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
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
import { Router } from 'express';
import type * as z from 'zod';
import {
  ACCESS_TOKEN_SECURITY,
  INVALID_BODY_RESPONSE,
  jsonBody,
  jsonResponse,
  problemResponse,
  SET_COOKIE_HEADER,
  SIGNED_IN_RESPONSES,
} from '../openapi/responses';
import {
  accountsJson,
  CROSS_SITE_RESPONSE,
  PASSWORD_CHECKS_BUSY,
  RETRY_AFTER_HEADER,
  sendSession,
} from '../auth/auth.router';
import type { AuthService } from '../auth/auth.service';
import { type ClientLimits, clientLimiter, defaultLimitInWords } from '../auth/client-limits';
import { SESSION_EXAMPLE, USER_EXAMPLE } from '../auth/auth.examples';
import {
  ACCEPT_INVITATION_EXAMPLE,
  INVITATION_EXAMPLE,
  INVITATION_PREVIEW_EXAMPLE,
  INVITE_EXAMPLE,
  PEOPLE_EXAMPLE,
  UPDATE_PERSON_EXAMPLE,
} from './people.examples';
import { requirePermission, requireUser } from '../auth/require-user';
import { refuseCrossSite } from '../auth/same-origin';
import { retryAfterHeader } from '../auth/too-many-requests';
import { IdParamSchema, TokenParamSchema, validateParams } from '../http/params';
import { validateBody } from '../http/validate';
import type { PeopleService } from './people.service';

/** The OpenAPI registry of people and invitations. */
export const peopleRegistry = new OpenAPIRegistry();

peopleRegistry.registerPath({
  method: 'get',
  path: '/api/v1/people',
  tags: ['People'],
  summary: 'The people of the organisation and its open invitations',
  description: 'Owners and managers (`people:read`).',
  security: ACCESS_TOKEN_SECURITY,
  responses: {
    200: jsonResponse(
      'Everyone, oldest first, and the invitations not yet accepted.',
      PeopleSchema,
      PEOPLE_EXAMPLE,
    ),
    ...SIGNED_IN_RESPONSES,
  },
});

peopleRegistry.registerPath({
  method: 'post',
  path: '/api/v1/people/invitations',
  tags: ['People'],
  summary: 'Invite someone by e-mail with a role',
  description:
    'Owners invite any role, managers technicians and viewers (`people:invite`). The e-mail carries a ' +
    'link to `/accept-invitation` that works once, for 7 days; a newer invitation to the same address ' +
    'replaces the open one.',
  security: ACCESS_TOKEN_SECURITY,
  request: jsonBody(InviteRequestSchema, INVITE_EXAMPLE),
  responses: {
    201: jsonResponse('Invited; the e-mail is sent.', InvitationSchema, INVITATION_EXAMPLE),
    400: INVALID_BODY_RESPONSE,
    ...SIGNED_IN_RESPONSES,
    409: problemResponse('The address already has an account (`code`: `EMAIL_TAKEN`, `errors` on `email`).'),
    502: problemResponse(
      'The invitation is saved but its e-mail could not be sent (`code`: `MAIL_NOT_SENT`).',
    ),
  },
});

peopleRegistry.registerPath({
  method: 'patch',
  path: '/api/v1/people/{id}',
  tags: ['People'],
  summary: "Change a person's role or status",
  description:
    'Owners change the role and status of anyone but themselves; managers deactivate or reactivate ' +
    'technicians and viewers only. Deactivating ends the person’s sessions. A person of another ' +
    'organisation is not found (404). The role and status of both people are read again when the ' +
    'change is made: an actor whose role or status changed meanwhile is refused (403), so two owners ' +
    'demoting each other at once leave one owner.',
  security: ACCESS_TOKEN_SECURITY,
  request: { params: IdParamSchema, ...jsonBody(UpdatePersonSchema, UPDATE_PERSON_EXAMPLE) },
  responses: {
    200: jsonResponse('The person as changed.', UserSchema, { ...USER_EXAMPLE, status: 'deactivated' }),
    400: INVALID_BODY_RESPONSE,
    ...SIGNED_IN_RESPONSES,
    404: problemResponse('No such person in the organisation.'),
    409: problemResponse('A change of one’s own role or status (`code`: `OWN_ACCOUNT`).'),
  },
});

peopleRegistry.registerPath({
  method: 'get',
  path: '/api/v1/invitations/{token}',
  tags: ['People'],
  summary: 'What an invitation link invites to',
  description: 'Needs no sign-in: the token of the link is the credential.',
  request: { params: TokenParamSchema },
  responses: {
    200: jsonResponse('The invitation.', InvitationPreviewSchema, INVITATION_PREVIEW_EXAMPLE),
    404: problemResponse('No invitation has this token.'),
    410: problemResponse('The invitation was accepted, replaced or has expired.'),
  },
});

peopleRegistry.registerPath({
  method: 'post',
  path: '/api/v1/invitations/{token}/accept',
  tags: ['People'],
  summary: 'Accept an invitation: choose a name and a password, and sign in',
  description:
    'Creates the person with the invitation’s role, spends the link, and signs them in. Limited per ' +
    `client address (${defaultLimitInWords('invitationAccept')} by default).`,
  request: { params: TokenParamSchema, ...jsonBody(AcceptInvitationSchema, ACCEPT_INVITATION_EXAMPLE) },
  responses: {
    201: { ...jsonResponse('Signed in.', SessionSchema, SESSION_EXAMPLE), headers: SET_COOKIE_HEADER },
    400: problemResponse('The body does not fit, or the password breaks a rule (`errors` on `password`).'),
    403: CROSS_SITE_RESPONSE,
    404: problemResponse('No invitation has this token.'),
    409: problemResponse('The address already has an account (`code`: `EMAIL_TAKEN`).'),
    410: problemResponse('The invitation was accepted, replaced or has expired.'),
    429: problemResponse(
      `Too many invitations accepted from this client address (\`code\`: \`CLIENT_THROTTLED\`), or ${PASSWORD_CHECKS_BUSY}.`,
      RETRY_AFTER_HEADER,
    ),
  },
});

/** The people routes and the invitation links, mounted on `/api/v1`. */
export function peopleRouter(deps: {
  auth: AuthService;
  people: PeopleService;
  /** The per-client limits (invitations accepted); the defaults for those left out. */
  clientLimits?: Partial<ClientLimits>;
}): Router {
  const { auth, people } = deps;
  const router = Router();
  const signedIn = requireUser(auth);

  router.get('/people', signedIn, requirePermission('people:read'), (_req, res) => {
    res.set('Cache-Control', 'no-store').json(people.list(res.locals.user!));
  });

  router.post(
    '/people/invitations',
    signedIn,
    requirePermission('people:invite'),
    ...accountsJson,
    validateBody(InviteRequestSchema),
    async (_req, res) => {
      const body = res.locals.body as z.output<typeof InviteRequestSchema>;
      res.status(201).json(await people.invite(res.locals.user!, body));
    },
  );

  router.patch(
    '/people/:id',
    signedIn,
    // Owners hold people:manage; managers reach the service's narrower rule through people:invite.
    requirePermission('people:manage', 'people:invite'),
    validateParams(IdParamSchema),
    ...accountsJson,
    validateBody(UpdatePersonSchema),
    (_req, res) => {
      const { id } = res.locals.params as z.output<typeof IdParamSchema>;
      const body = res.locals.body as z.output<typeof UpdatePersonSchema>;
      res.json(people.update(res.locals.user!, id, body));
    },
  );

  router.get('/invitations/:token', validateParams(TokenParamSchema), (_req, res) => {
    const { token } = res.locals.params as z.output<typeof TokenParamSchema>;
    res.set('Cache-Control', 'no-store').json(people.preview(token));
  });

  router.post(
    '/invitations/:token/accept',
    refuseCrossSite(auth.settings.publicUrl),
    clientLimiter('invitationAccept', deps.clientLimits),
    validateParams(TokenParamSchema),
    ...accountsJson,
    validateBody(AcceptInvitationSchema),
    async (_req, res) => {
      const { token } = res.locals.params as z.output<typeof TokenParamSchema>;
      const body = res.locals.body as z.output<typeof AcceptInvitationSchema>;
      sendSession(res, await people.accept(token, body), auth.settings.secureCookie, 201);
    },
  );

  router.use(retryAfterHeader);
  return router;
}
