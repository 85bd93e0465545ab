/*
 * The examples of the accounts routes in the OpenAPI document. A spec parses each with its schema, so
 * that the reference never shows an example the server would refuse or never send. Invented people of
 * the demo organisation, on the reserved `.test` domain.
 */

const ORGANISATION = { id: 1, name: 'Ridgeline Rotor Service' };

export const USER_EXAMPLE = {
  id: 3,
  email: 'technician@ridgeline-rotor.test',
  name: 'Tomasz Wrenfield',
  role: 'technician',
  status: 'active',
  organisation: ORGANISATION,
  createdAt: '2026-05-04T08:00:00.000Z',
} as const;

export const SIGN_IN_EXAMPLE = {
  email: 'technician@ridgeline-rotor.test',
  password: 'gravel road under the maple',
};

export const SESSION_EXAMPLE = {
  accessToken:
    'eyJhbGciOiJIUzI1NiIsInR5cCI6IkpXVCJ9.eyJvcmciOjEsInJvbGUiOiJ0ZWNobmljaWFuIiwic3ViIjoiMyJ9.' +
    'c2lnbmF0dXJlLW9mLXRoZS1leGFtcGxl',
  expiresInSeconds: 600,
  user: USER_EXAMPLE,
  permissions: [
    'jobs:read',
    'jobs:write',
    'records:read',
    'machines:write',
    'customers:write',
    'reports:read',
    'docs:read',
    'calc:use',
  ],
};

export const ME_EXAMPLE = { user: USER_EXAMPLE, permissions: SESSION_EXAMPLE.permissions };

export const PASSWORD_RESET_EXAMPLE = { email: 'technician@ridgeline-rotor.test' };

export const PASSWORD_RESET_CONFIRM_EXAMPLE = {
  token: 'q8W1mZk3r5T7v9X0b2N4c6M8a0S2d4F6g8H0j2K4l6P',
  password: 'a kettle of copper rivets',
};

export const INVITE_EXAMPLE = {
  email: 'new.technician@ridgeline-rotor.test',
  role: 'technician',
  name: 'Ines Halloway',
};

export const INVITATION_EXAMPLE = {
  id: 4,
  email: 'new.technician@ridgeline-rotor.test',
  role: 'technician',
  invitedBy: 'Maren Oakhurst',
  expiresAt: '2026-05-11T08:00:00.000Z',
  acceptedAt: null,
};

export const INVITATION_PREVIEW_EXAMPLE = {
  email: 'new.technician@ridgeline-rotor.test',
  role: 'technician',
  organisationName: ORGANISATION.name,
  expiresAt: '2026-05-11T08:00:00.000Z',
};

export const ACCEPT_INVITATION_EXAMPLE = {
  name: 'Ines Halloway',
  password: 'three herons over the weir',
};

export const PEOPLE_EXAMPLE = { people: [USER_EXAMPLE], invitations: [INVITATION_EXAMPLE] };

export const UPDATE_PERSON_EXAMPLE = { status: 'deactivated' };

export const OUTBOX_EXAMPLE = {
  messages: [
    {
      id: 12,
      from: 'Counterpoise <no-reply@counterpoise.test>',
      to: ['new.technician@ridgeline-rotor.test'],
      subject: 'Maren Oakhurst invites you to Ridgeline Rotor Service on Counterpoise',
      text: 'Hello,\n\nAccept the invitation: http://localhost:4300/accept-invitation?token=…\n',
      html: null,
      receivedAt: '2026-05-04T08:00:01.000Z',
    },
  ],
};

const KEY_SUMMARY = {
  id: 2,
  name: 'Dealer portal',
  prefix: 'cpk_Q2xvY2s5',
  limitPerMinute: 600,
  createdAt: '2026-05-04T08:00:00.000Z',
  lastUsedAt: null,
  revokedAt: null,
};

export const API_KEY_LIST_EXAMPLE = { keys: [KEY_SUMMARY] };

export const CREATED_API_KEY_EXAMPLE = {
  key: 'cpk_Q2xvY2s5bWFkZS11cC1mb3ItdGhlLWV4YW1wbGU0abc',
  summary: KEY_SUMMARY,
};
