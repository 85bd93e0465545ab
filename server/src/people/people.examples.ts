/*
 * The examples of the people and invitation routes in the OpenAPI document. A spec parses each with its schema, so that the
 * reference never shows an example the server would refuse or never send. Invented people of the demo
 * organisation, on the reserved `.test` domain.
 */

import type {
  AcceptInvitationSchema,
  InvitationPreviewSchema,
  InvitationSchema,
  InviteRequestSchema,
  PeopleSchema,
  UpdatePersonSchema,
} from '@counterpoise/api';
import type * as z from 'zod';

import { ORGANISATION, USER_EXAMPLE } from '../auth/auth.examples';

export const INVITE_EXAMPLE: z.input<typeof InviteRequestSchema> = {
  email: 'new.technician@ridgeline-rotor.test',
  role: 'technician',
  name: 'Ines Halloway',
};

export const INVITATION_EXAMPLE: z.input<typeof InvitationSchema> = {
  id: 4,
  email: 'new.technician@ridgeline-rotor.test',
  role: 'technician',
  invitedBy: 'Maren Oakhurst',
  expiresAt: '2026-05-11T08:00:00.000Z',
  acceptedAt: null,
};

export const INVITATION_PREVIEW_EXAMPLE: z.input<typeof InvitationPreviewSchema> = {
  email: 'new.technician@ridgeline-rotor.test',
  role: 'technician',
  organisationName: ORGANISATION.name,
  expiresAt: '2026-05-11T08:00:00.000Z',
};

export const ACCEPT_INVITATION_EXAMPLE: z.input<typeof AcceptInvitationSchema> = {
  name: 'Ines Halloway',
  password: 'three herons over the weir',
};

export const PEOPLE_EXAMPLE: z.input<typeof PeopleSchema> = {
  people: [USER_EXAMPLE],
  invitations: [INVITATION_EXAMPLE],
};

export const UPDATE_PERSON_EXAMPLE: z.input<typeof UpdatePersonSchema> = { status: 'deactivated' };
