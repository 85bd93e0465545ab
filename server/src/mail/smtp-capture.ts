import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { Clock } from '../clock';
import type { Database } from '../db/database';
import { MailRepo } from './mail.repo';

/** The header that names the organisation a message belongs to, so that its Outbox can show it. */
export const ORGANISATION_HEADER = 'X-Counterpoise-Organisation';

/** The largest message the local server takes. */
const MAX_MESSAGE_BYTES = 2 * 1024 * 1024;

/** The local SMTP server, listening. */
export interface SmtpCapture {
  readonly port: number;
  close(): Promise<void>;
}

function addressesOf(field: AddressObject | AddressObject[] | undefined): string[] {
  const objects = field === undefined ? [] : Array.isArray(field) ? field : [field];
  return objects.flatMap((object) =>
    object.value.flatMap((entry) => (entry.address ? [entry.address.toLowerCase()] : [])),
  );
}

/**
 * Starts the local SMTP server of development and tests on 127.0.0.1: it takes every message (no
 * authentication, no TLS: it listens on the loopback only), parses it with mailparser and stores it in
 * `mail_messages`, which the Outbox reads. The server answers the client only once the message is
 * stored, so a sender that has been told "sent" finds it there.
 */
export async function startSmtpCapture(deps: {
  database: Database;
  clock: Clock;
  port: number;
  log?: (message: string, error?: unknown) => void;
}): Promise<SmtpCapture> {
  const repo = new MailRepo(deps.database.orm);
  const log = deps.log ?? ((message, error) => console.error(message, error));
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    size: MAX_MESSAGE_BYTES,
    banner: 'Counterpoise local mail capture',
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const organisation = Number(parsed.headers.get(ORGANISATION_HEADER.toLowerCase()));
          repo.insert({
            organisationId: Number.isSafeInteger(organisation) && organisation > 0 ? organisation : null,
            from: parsed.from?.text ?? '',
            to: addressesOf(parsed.to),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
            receivedAt: deps.clock.now(),
          });
          callback();
        })
        .catch((error: unknown) => {
          log('The local mail server could not store a message.', error);
          callback(new Error('The message could not be stored.'));
        });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(deps.port, '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
  server.on('error', (error) => log('The local mail server failed.', error));
  const { port } = server.server.address() as AddressInfo;
  return { port, close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}
