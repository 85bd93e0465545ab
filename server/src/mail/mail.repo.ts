import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import type { Orm } from '../db/database';
import { mailAttachments, mailMessages } from '../db/schema';

/**
 * A captured message as stored: what shows that it went out, its links' secrets masked
 * (`maskLinkSecrets`); `html` is no longer kept and stays null.
 */
export interface StoredMessage {
  readonly id: number;
  readonly organisationId: number | null;
  readonly from: string;
  readonly to: string[];
  readonly subject: string;
  readonly text: string;
  readonly html: string | null;
  readonly receivedAt: Date;
}

/** A file a captured message carried, without its bytes. */
export interface StoredAttachmentSummary {
  readonly id: number;
  readonly messageId: number;
  readonly filename: string;
  readonly contentType: string;
  readonly byteSize: number;
}

/** A file a captured message carried, with its bytes. */
export interface StoredAttachment extends StoredAttachmentSummary {
  readonly content: Buffer;
}

/** How many messages the Outbox shows at most, newest first. */
export const OUTBOX_LIMIT = 200;

/** The Drizzle queries of `mail_messages` and `mail_attachments`. */
export class MailRepo {
  constructor(private readonly orm: Orm) {}

  /** Stores a message and its attachments in one transaction; answers the message's id. */
  insert(
    message: Omit<StoredMessage, 'id'>,
    attachments: readonly Omit<StoredAttachment, 'id' | 'messageId'>[] = [],
  ): number {
    return this.orm.transaction((tx) => {
      const id = tx
        .insert(mailMessages)
        .values({ ...message, to: JSON.stringify(message.to) })
        .returning({ id: mailMessages.id })
        .get().id;
      for (const attachment of attachments) {
        tx.insert(mailAttachments)
          .values({ ...attachment, messageId: id })
          .run();
      }
      return id;
    });
  }

  /** The organisation's messages, newest first. */
  listForOrganisation(organisationId: number, limit = OUTBOX_LIMIT): StoredMessage[] {
    return this.orm
      .select()
      .from(mailMessages)
      .where(eq(mailMessages.organisationId, organisationId))
      .orderBy(desc(mailMessages.id))
      .limit(limit)
      .all()
      .map((row) => ({ ...row, to: JSON.parse(row.to) as string[] }));
  }

  /** The attachments (without their bytes) of the messages named, in the order they were sent. */
  attachmentsOf(messageIds: readonly number[]): StoredAttachmentSummary[] {
    if (messageIds.length === 0) return [];
    return this.orm
      .select({
        id: mailAttachments.id,
        messageId: mailAttachments.messageId,
        filename: mailAttachments.filename,
        contentType: mailAttachments.contentType,
        byteSize: mailAttachments.byteSize,
      })
      .from(mailAttachments)
      .where(inArray(mailAttachments.messageId, [...messageIds]))
      .orderBy(asc(mailAttachments.id))
      .all();
  }

  /** One attachment of one of the organisation's messages, with its bytes; undefined otherwise. */
  findAttachment(organisationId: number, messageId: number, id: number): StoredAttachment | undefined {
    return this.orm
      .select({
        id: mailAttachments.id,
        messageId: mailAttachments.messageId,
        filename: mailAttachments.filename,
        contentType: mailAttachments.contentType,
        byteSize: mailAttachments.byteSize,
        content: mailAttachments.content,
      })
      .from(mailAttachments)
      .innerJoin(mailMessages, eq(mailMessages.id, mailAttachments.messageId))
      .where(
        and(
          eq(mailAttachments.id, id),
          eq(mailAttachments.messageId, messageId),
          eq(mailMessages.organisationId, organisationId),
        ),
      )
      .get();
  }
}
