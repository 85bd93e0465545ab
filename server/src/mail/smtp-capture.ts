import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { Clock } from '../clock';
import type { Database } from '../db/database';
import { MailRepo } from './mail.repo';
import { maskLinkSecrets } from './mask-secrets';

/** The header that names the organisation a message belongs to, so that its Outbox can show it. */
export const ORGANISATION_HEADER = 'X-Counterpoise-Organisation';

/**
 * The largest message the local server takes: a service report's PDF (a few hundred kB, a third more in
 * base64) fits with room to spare.
 */
export const MAX_MESSAGE_BYTES = 8 * 1024 * 1024;

/** A user name and password for SMTP AUTH, in nodemailer's `auth` shape. */
export interface SmtpCredentials {
  readonly user: string;
  readonly pass: string;
}

/** The local SMTP server, listening. */
export interface SmtpCapture {
  readonly port: number;
  /** Drawn at random when the server starts: only a process that was handed them can send to it. */
  readonly credentials: SmtpCredentials;
  close(): Promise<void>;
}

/** Compares two secrets in a time that does not depend on where they first differ. */
function sameSecret(given: string, expected: string): boolean {
  const digest = (text: string) => createHash('sha256').update(text, 'utf8').digest();
  return timingSafeEqual(digest(given), digest(expected));
}

function addressesOf(field: AddressObject | AddressObject[] | undefined): string[] {
  const objects = field === undefined ? [] : Array.isArray(field) ? field : [field];
  return objects.flatMap((object) =>
    object.value.flatMap((entry) => (entry.address ? [entry.address.toLowerCase()] : [])),
  );
}

/**
 * Starts the local SMTP server of development and tests on 127.0.0.1. Every local user can reach the
 * loopback, so the server draws a user name and password at start and refuses MAIL FROM until a client
 * has authenticated with them (AUTH PLAIN or LOGIN; no TLS, since the password never leaves the
 * machine). It parses each message with mailparser and stores what the Outbox needs to show that it went
 * out (sender, recipients, subject, time, the plain text with every link's secret masked, and the files it
 * carried, such as a service report, so that an owner can open what the customer received): never a
 * link that works, nor the HTML part, so that reading the database or the Outbox takes over no account.
 * The server answers the client only once the message is stored, so a sender told "sent" finds it there.
 */
export async function startSmtpCapture(deps: {
  database: Database;
  clock: Clock;
  port: number;
  log?: (message: string, error?: unknown) => void;
}): Promise<SmtpCapture> {
  const repo = new MailRepo(deps.database.orm);
  const log = deps.log ?? ((message, error) => console.error(message, error));
  const credentials: SmtpCredentials = {
    user: `counterpoise-${randomBytes(6).toString('hex')}`,
    pass: randomBytes(32).toString('base64url'),
  };
  const server = new SMTPServer({
    authOptional: false,
    authMethods: ['PLAIN', 'LOGIN'],
    allowInsecureAuth: true,
    disabledCommands: ['STARTTLS'],
    size: MAX_MESSAGE_BYTES,
    banner: 'Counterpoise local mail capture',
    logger: false,
    onAuth(auth, _session, callback) {
      // Both compared, always, so that the time taken tells nothing of which one was wrong.
      const userMatches = sameSecret(auth.username ?? '', credentials.user);
      const passMatches = sameSecret(auth.password ?? '', credentials.pass);
      if (userMatches && passMatches) callback(null, { user: credentials.user });
      else callback(new Error('Invalid user name or password.'));
    },
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          // smtp-server only announces the size; a message past it is read to its end and refused here.
          if ((stream as { sizeExceeded?: boolean }).sizeExceeded) {
            callback(
              Object.assign(new Error(`The message is larger than ${MAX_MESSAGE_BYTES} bytes.`), {
                responseCode: 552,
              }),
            );
            return;
          }
          const organisation = Number(parsed.headers.get(ORGANISATION_HEADER.toLowerCase()));
          repo.insert(
            {
              organisationId: Number.isSafeInteger(organisation) && organisation > 0 ? organisation : null,
              from: parsed.from?.text ?? '',
              to: addressesOf(parsed.to),
              subject: maskLinkSecrets(parsed.subject ?? ''),
              text: maskLinkSecrets(parsed.text ?? ''),
              html: null,
              receivedAt: deps.clock.now(),
            },
            parsed.attachments.map((attachment) => ({
              filename: attachment.filename ?? 'attachment',
              contentType: attachment.contentType,
              byteSize: attachment.content.length,
              content: attachment.content,
            })),
          );
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
  return {
    port,
    credentials,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
