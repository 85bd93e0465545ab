import { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import { OutboxSchema } from '@counterpoise/api';
import { Router } from 'express';
import { ACCESS_TOKEN_SECURITY, jsonResponse, SIGNED_IN_RESPONSES } from '../openapi/responses';
import type { AuthService } from '../auth/auth.service';
import { OUTBOX_EXAMPLE } from './outbox.examples';
import { requirePermission, requireUser } from '../auth/require-user';
import { MailRepo, OUTBOX_LIMIT } from './mail.repo';
import type { Database } from '../db/database';

/** The OpenAPI registry of the Outbox. */
export const outboxRegistry = new OpenAPIRegistry();

outboxRegistry.registerPath({
  method: 'get',
  path: '/api/v1/outbox',
  tags: ['Outbox'],
  summary: 'The e-mails the local mail server captured for the organisation',
  description:
    `Owners (\`outbox:read\`). In development and tests the server keeps every e-mail it would send ` +
    `instead of sending it; this lists the organisation's, newest first, at most ${OUTBOX_LIMIT}. ` +
    'Empty when `SMTP_URL` sends through a real server.',
  security: ACCESS_TOKEN_SECURITY,
  responses: {
    200: jsonResponse('The messages.', OutboxSchema, OUTBOX_EXAMPLE),
    ...SIGNED_IN_RESPONSES,
  },
});

/** `GET /outbox`, mounted on `/api/v1`. */
export function outboxRouter(deps: { auth: AuthService; database: Database }): Router {
  const router = Router();
  const repo = new MailRepo(deps.database.orm);
  router.get('/outbox', requireUser(deps.auth), requirePermission('outbox:read'), (_req, res) => {
    const messages = repo.listForOrganisation(res.locals.user!.organisationId).map((message) => ({
      id: message.id,
      from: message.from,
      to: message.to,
      subject: message.subject,
      text: message.text,
      html: message.html,
      receivedAt: message.receivedAt.toISOString(),
    }));
    res.set('Cache-Control', 'no-store').json({ messages });
  });
  return router;
}
