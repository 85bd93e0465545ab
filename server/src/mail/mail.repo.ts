import { desc, eq } from 'drizzle-orm';
import type { Orm } from '../db/database';
import { mailMessages } from '../db/schema';

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

/** How many messages the Outbox shows at most, newest first. */
export const OUTBOX_LIMIT = 200;

/** The Drizzle queries of `mail_messages`. */
export class MailRepo {
  constructor(private readonly orm: Orm) {}

  insert(message: Omit<StoredMessage, 'id'>): number {
    return this.orm
      .insert(mailMessages)
      .values({ ...message, to: JSON.stringify(message.to) })
      .returning({ id: mailMessages.id })
      .get().id;
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
}
