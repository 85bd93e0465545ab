import { OutboxSchema } from '@counterpoise/api';
import type { Database } from '../db/database';
import { type AccessRule, type FeatureRoutes, RouteTable } from '../http/route';
import { MailRepo, OUTBOX_LIMIT } from './mail.repo';
import { OUTBOX_EXAMPLE } from './outbox.examples';

/** Who may read the Outbox: the app maps it to a permission (`outbox:read`). */
export type OutboxAccess = 'read';

/** The signed-in person of a request that passed the guard. */
function organisationOf(locals: { user?: { organisationId: number } }): number {
  if (locals.user === undefined) throw new Error('The outbox route runs behind requireUser.');
  return locals.user.organisationId;
}

/** `GET /outbox`, mounted on `/api/v1`; who may call it comes from the app. */
export function outboxRoutes(deps: {
  database: Database;
  access: Readonly<Record<OutboxAccess, AccessRule>>;
}): FeatureRoutes {
  const repo = new MailRepo(deps.database.orm);
  const table = new RouteTable({ basePath: '/api/v1', tag: 'Outbox', access: deps.access });
  table.add<undefined, undefined, undefined, typeof OutboxSchema>({
    method: 'get',
    path: '/outbox',
    summary: 'The e-mails the local mail server captured for the organisation',
    description:
      'In development and tests the server keeps every e-mail it would send instead of sending it; ' +
      `this lists the organisation's, newest first, at most ${OUTBOX_LIMIT}. Empty when \`SMTP_URL\` ` +
      'sends through a real server.',
    access: 'read',
    answer: { status: 200, description: 'The messages.', schema: OutboxSchema, example: OUTBOX_EXAMPLE },
    handle: ({ res }) => {
      const messages = repo.listForOrganisation(organisationOf(res.locals)).map((message) => ({
        id: message.id,
        from: message.from,
        to: message.to,
        subject: message.subject,
        text: message.text,
        html: message.html,
        receivedAt: message.receivedAt.toISOString(),
      }));
      res.set('Cache-Control', 'no-store');
      return { messages };
    },
  });
  return table;
}
