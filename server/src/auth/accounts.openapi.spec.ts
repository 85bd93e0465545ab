import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type * as z from 'zod';
import {
  AcceptInvitationSchema,
  ApiKeyListSchema,
  CreatedApiKeySchema,
  InvitationPreviewSchema,
  InvitationSchema,
  InviteRequestSchema,
  MeSchema,
  OrganisationUsageReportSchema,
  OutboxSchema,
  PasswordResetConfirmSchema,
  PasswordResetRequestSchema,
  PeopleSchema,
  SessionSchema,
  SignInRequestSchema,
  UpdatePersonSchema,
  UserSchema,
} from '@counterpoise/api';
import { createApp } from '../app';
import type { OpenApiDocument } from '../openapi/openapi';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { passwordWeakness } from './passwords';

let temporary: TemporaryDatabase;
let document: OpenApiDocument;
beforeAll(() => {
  temporary = openTemporaryDatabase();
  document = createApp({ database: temporary.database }).locals.openApiDocument!;
});
afterAll(() => temporary.dispose());

/** Every accounts route of the contract, with the schemas of its example request and answer. */
const ROUTES: [string, string, z.ZodType | null, string, z.ZodType | null][] = [
  ['post', '/api/v1/auth/sign-in', SignInRequestSchema, '200', SessionSchema],
  ['post', '/api/v1/auth/refresh', null, '200', SessionSchema],
  ['post', '/api/v1/auth/sign-out', null, '204', null],
  ['post', '/api/v1/auth/password-reset', PasswordResetRequestSchema, '202', null],
  ['post', '/api/v1/auth/password-reset/confirm', PasswordResetConfirmSchema, '204', null],
  ['get', '/api/v1/me', null, '200', MeSchema],
  ['get', '/api/v1/invitations/{token}', null, '200', InvitationPreviewSchema],
  ['post', '/api/v1/invitations/{token}/accept', AcceptInvitationSchema, '201', SessionSchema],
  ['get', '/api/v1/people', null, '200', PeopleSchema],
  ['post', '/api/v1/people/invitations', InviteRequestSchema, '201', InvitationSchema],
  ['patch', '/api/v1/people/{id}', UpdatePersonSchema, '200', UserSchema],
  ['get', '/api/v1/outbox', null, '200', OutboxSchema],
  ['get', '/api/v1/keys', null, '200', ApiKeyListSchema],
  ['post', '/api/v1/keys', null, '201', CreatedApiKeySchema],
  ['delete', '/api/v1/keys/{id}', null, '204', null],
];

interface Operation {
  requestBody?: { content: Record<string, { example?: unknown }> };
  responses: Record<string, { content?: Record<string, { example?: unknown }> }>;
}

describe('the OpenAPI document of the accounts routes', () => {
  it.each(ROUTES)(
    'documents %s %s with examples its schemas accept',
    (method, path, requestSchema, status, responseSchema) => {
      const operation = (document.paths?.[path] as Record<string, Operation> | undefined)?.[method];
      expect(operation, `${method} ${path}`).toBeDefined();
      expect(operation!.responses[status]).toBeDefined();
      if (requestSchema) {
        const example = operation!.requestBody?.content['application/json']?.example;
        expect(requestSchema.safeParse(example).error).toBeUndefined();
      }
      if (responseSchema) {
        const example = operation!.responses[status]?.content?.['application/json']?.example;
        expect(responseSchema.safeParse(example).error).toBeUndefined();
      }
    },
  );

  it('shows passwords in its examples that the password rules accept', () => {
    expect(passwordWeakness('gravel road under the maple')).toBeNull();
    expect(passwordWeakness('a kettle of copper rivets')).toBeNull();
    expect(passwordWeakness('three herons over the weir')).toBeNull();
  });

  it('carries an organisation usage example that its schema accepts', () => {
    const example = (document.components?.schemas?.['OrganisationUsageReport'] as { example?: unknown })
      .example;
    expect(OrganisationUsageReportSchema.safeParse(example).error).toBeUndefined();
  });
});
