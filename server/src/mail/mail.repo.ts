import { and, desc, eq } from 'drizzle-orm';
import type { Orm } from '../db/database';
import { mailMessages } from '../db/schema';

/** A captured message as stored. */
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

  /** Every message to an address, newest first (for tests that follow a link). */
  listTo(address: string, organisationId?: number): StoredMessage[] {
    const rows = this.orm
      .select()
      .from(mailMessages)
      .where(organisationId === undefined ? undefined : and(eq(mailMessages.organisationId, organisationId)))
      .orderBy(desc(mailMessages.id))
      .all()
      .map((row) => ({ ...row, to: JSON.parse(row.to) as string[] }));
    return rows.filter((row) => row.to.includes(address.toLowerCase()));
  }
}
