import type {
  AcceptInvitationSchema,
  ApiKeyListSchema,
  CreatedApiKeySchema,
  InvitationPreviewSchema,
  InvitationSchema,
  InviteRequestSchema,
  OutboxMessageSchema,
  OutboxSchema,
  PeopleSchema,
  UpdatePersonSchema,
} from '@counterpoise/api';
import type * as z from 'zod';

/*
 * The shapes of the accounts routes, derived from the shared schemas by type alone: importing a type
 * costs the bundle nothing, so the pages that only read these answers never load zod.
 */

/** A pending or accepted invitation, as people managers see it. */
export type Invitation = z.output<typeof InvitationSchema>;
/** `GET /api/v1/people`. */
export type People = z.output<typeof PeopleSchema>;
/** `POST /api/v1/people/invitations`. */
export type InviteRequest = z.input<typeof InviteRequestSchema>;
/** `PATCH /api/v1/people/{id}`. */
export type UpdatePerson = z.input<typeof UpdatePersonSchema>;
/** `GET /api/v1/invitations/{token}`. */
export type InvitationPreview = z.output<typeof InvitationPreviewSchema>;
/** `POST /api/v1/invitations/{token}/accept`. */
export type AcceptInvitation = z.input<typeof AcceptInvitationSchema>;
/** One captured e-mail. */
export type OutboxMessage = z.output<typeof OutboxMessageSchema>;
/** `GET /api/v1/outbox`. */
export type Outbox = z.output<typeof OutboxSchema>;
/** `GET /api/v1/keys`. */
export type ApiKeyList = z.output<typeof ApiKeyListSchema>;
/** `POST /api/v1/keys`: the whole key, this once. */
export type CreatedApiKey = z.output<typeof CreatedApiKeySchema>;
