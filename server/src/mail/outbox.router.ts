import { OutboxSchema } from '@counterpoise/api';
import * as z from 'zod';
import type { Database } from '../db/database';
import { HttpProblem } from '../http/problem';
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

const positiveId = (name: string, example: string) =>
  z
    .string()
    .regex(/^[1-9]\d{0,15}$/, { error: `The ${name} is a positive whole number.` })
    .transform(Number)
    .meta({ param: { name, in: 'path' }, example });

const AttachmentParamSchema = z.object({
  messageId: positiveId('messageId', '12'),
  id: positiveId('id', '3'),
});

/** A file name safe inside a quoted `Content-Disposition` parameter: ASCII, no quotes or backslashes. */
function dispositionName(filename: string): string {
  const safe = filename.replace(/[^\x20-\x7E]|["\\]/g, '_').trim();
  return safe === '' ? 'attachment' : safe;
}

/** `GET /outbox` and its attachments, mounted on `/api/v1`; who may call them comes from the app. */
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
      `this lists the organisation's, newest first, at most ${OUTBOX_LIMIT}, each with the files it ` +
      'carried (without their bytes: `GET /outbox/{messageId}/attachments/{id}` opens one). Empty when ' +
      '`SMTP_URL` sends through a real server.',
    access: 'read',
    answer: { status: 200, description: 'The messages.', schema: OutboxSchema, example: OUTBOX_EXAMPLE },
    handle: ({ res }) => {
      const stored = repo.listForOrganisation(organisationOf(res.locals));
      const attachments = repo.attachmentsOf(stored.map((message) => message.id));
      const messages = stored.map((message) => ({
        id: message.id,
        from: message.from,
        to: message.to,
        subject: message.subject,
        text: message.text,
        html: message.html,
        receivedAt: message.receivedAt.toISOString(),
        attachments: attachments
          .filter((attachment) => attachment.messageId === message.id)
          .map((attachment) => ({
            id: attachment.id,
            filename: attachment.filename,
            contentType: attachment.contentType,
            byteSize: attachment.byteSize,
          })),
      }));
      res.set('Cache-Control', 'no-store');
      return { messages };
    },
  });
  table.add({
    method: 'get',
    path: '/outbox/{messageId}/attachments/{id}',
    summary: 'A file a captured e-mail carried',
    description:
      'The bytes as the message carried them, with their content type, always as a download ' +
      '(`Content-Disposition: attachment`, `X-Content-Type-Options: nosniff`), so that no file sent by mail ' +
      'runs as a page of the workbench. Only the organisation’s own messages.',
    access: 'read',
    params: AttachmentParamSchema,
    answer: {
      status: 200,
      description: 'The file.',
      content: { 'application/octet-stream': { schema: { type: 'string', format: 'binary' } } },
    },
    problems: {
      404: 'No such attachment of a message of your organisation (another organisation’s are not found either).',
    },
    handle: ({ params, res }) => {
      const attachment = repo.findAttachment(organisationOf(res.locals), params.messageId, params.id);
      if (attachment === undefined) {
        throw new HttpProblem(404, 'Not Found', 'No such attachment of a message of your organisation.');
      }
      res
        .status(200)
        .set({
          'Cache-Control': 'no-store',
          'Content-Disposition': `attachment; filename="${dispositionName(attachment.filename)}"`,
          'X-Content-Type-Options': 'nosniff',
        })
        .type(attachment.contentType)
        .send(attachment.content);
      return undefined;
    },
  });
  return table;
}
