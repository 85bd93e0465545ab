import nodemailer from 'nodemailer';
import { ORGANISATION_HEADER, type SmtpCredentials } from './smtp-capture';

/** One e-mail to send on behalf of an organisation. */
export interface OutgoingMail {
  readonly organisationId: number;
  readonly to: string;
  readonly subject: string;
  readonly text: string;
  readonly html: string;
  /** Files sent with the message (a service report's PDF). */
  readonly attachments?: readonly MailAttachment[];
  /** The Message-ID to send it under (`<…@…>`), so that the sender can record it; one is drawn otherwise. */
  readonly messageId?: string;
}

/** A file sent with an e-mail. */
export interface MailAttachment {
  readonly filename: string;
  readonly contentType: string;
  readonly content: Buffer;
}

/** Sends e-mail; resolves once the SMTP server has accepted the message. */
export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
}

/**
 * A mailer over nodemailer's SMTP transport: to `SMTP_URL` when set, otherwise to the local capture
 * server on 127.0.0.1 with the credentials it drew at start (plain SMTP on the loopback, no TLS to
 * negotiate; the password never leaves the machine).
 */
export function smtpMailer(
  options: { from: string } & ({ url: string } | { localPort: number; auth: SmtpCredentials }),
): Mailer {
  const transport =
    'url' in options
      ? nodemailer.createTransport(options.url)
      : nodemailer.createTransport({
          host: '127.0.0.1',
          port: options.localPort,
          secure: false,
          ignoreTLS: true,
          auth: { user: options.auth.user, pass: options.auth.pass },
        });
  return {
    async send(mail) {
      await transport.sendMail({
        from: options.from,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        html: mail.html,
        headers: { [ORGANISATION_HEADER]: String(mail.organisationId) },
        ...(mail.messageId === undefined ? {} : { messageId: mail.messageId }),
        ...(mail.attachments === undefined
          ? {}
          : {
              attachments: mail.attachments.map((attachment) => ({
                filename: attachment.filename,
                contentType: attachment.contentType,
                content: attachment.content,
              })),
            }),
      });
    },
  };
}

const escapeHtml = (text: string) => text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** Paragraphs and, when given, one link after them, as plain text and as simple HTML. */
export function composeMail(paragraphs: readonly string[], link?: { label: string; url: string }) {
  const text = [...paragraphs, ...(link ? [`${link.label}: ${link.url}`] : [])].join('\n\n');
  const html = [
    ...paragraphs.map((paragraph) => `<p>${escapeHtml(paragraph)}</p>`),
    ...(link ? [`<p><a href="${escapeHtml(link.url)}">${escapeHtml(link.label)}</a></p>`] : []),
  ].join('\n');
  return { text: `${text}\n`, html };
}
