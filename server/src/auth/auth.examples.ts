/*
 * The examples of the sign-in routes in the OpenAPI document. A spec parses each with its schema, so that the
 * reference never shows an example the server would refuse or never send. Invented people of the demo
 * organisation, on the reserved `.test` domain.
 */

import type {
  MeSchema,
  PasswordResetConfirmSchema,
  PasswordResetRequestSchema,
  SessionSchema,
  SignInRequestSchema,
} from '@counterpoise/api';
import type * as z from 'zod';

/** The demo organisation of the examples. */
export const ORGANISATION = { id: 1, name: 'Ridgeline Rotor Service' };

export const USER_EXAMPLE = {
  id: 3,
  email: 'technician@ridgeline-rotor.test',
  name: 'Tomasz Wrenfield',
  role: 'technician',
  status: 'active',
  organisation: ORGANISATION,
  createdAt: '2026-05-04T08:00:00.000Z',
} as const;

export const SIGN_IN_EXAMPLE: z.input<typeof SignInRequestSchema> = {
  email: 'technician@ridgeline-rotor.test',
  password: 'gravel road under the maple',
};

export const SESSION_EXAMPLE: z.input<typeof SessionSchema> = {
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

export const ME_EXAMPLE: z.input<typeof MeSchema> = {
  user: USER_EXAMPLE,
  permissions: SESSION_EXAMPLE.permissions,
};

export const PASSWORD_RESET_EXAMPLE: z.input<typeof PasswordResetRequestSchema> = {
  email: 'technician@ridgeline-rotor.test',
};

export const PASSWORD_RESET_CONFIRM_EXAMPLE: z.input<typeof PasswordResetConfirmSchema> = {
  token: 'q8W1mZk3r5T7v9X0b2N4c6M8a0S2d4F6g8H0j2K4l6P',
  password: 'a kettle of copper rivets',
};
