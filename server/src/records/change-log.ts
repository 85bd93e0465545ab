import { and, desc, eq } from 'drizzle-orm';
import type { RecordChange, RecordHistory } from '@counterpoise/api';
import type { Orm } from '../db/database';
import { recordChanges, users } from '../db/schema';

/** The kinds of record the change log keeps, as its rows name them. */
export type RecordKind = (typeof recordChanges.$inferInsert)['entityKind'];

/** What a change did to a record. */
export type ChangeAction = RecordChange['action'];

/** One field of a change: its value before and after, as the API shows the record. */
export interface FieldChange {
  readonly field: string;
  readonly before: unknown;
  readonly after: unknown;
}

/**
 * Who acts on the shop's records: a signed-in person of an organisation (the demo seed acts as the demo
 * owner). Everything they read or write is their organisation's.
 */
export interface Actor {
  readonly id: number;
  readonly organisationId: number;
}

/**
 * JSON text with the keys of every object sorted, so that two values that differ only in the order of
 * their keys (a JSON column read back, the same value parsed from a request) compare equal.
 */
function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_key, inner: unknown) =>
    inner !== null && typeof inner === 'object' && !Array.isArray(inner)
      ? Object.fromEntries(Object.entries(inner).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)))
      : inner,
  );
}

/**
 * The fields among `fields` whose value differs between two versions of a record, each with both
 * values. An absent value counts as null, the way the API shows a field that is not set.
 */
export function changedFields<T extends object>(
  before: Partial<T>,
  after: Partial<T>,
  fields: readonly (keyof T & string)[],
): FieldChange[] {
  const changes: FieldChange[] = [];
  for (const field of fields) {
    const was = before[field] ?? null;
    const is = after[field] ?? null;
    if (canonicalJson(was) !== canonicalJson(is)) changes.push({ field, before: was, after: is });
  }
  return changes;
}

/**
 * The fields a new record was created with (every one that holds something), as changes from nothing,
 * so that the history's first entry says what the record started as.
 */
export function initialFields<T extends object>(
  created: T,
  fields: readonly (keyof T & string)[],
): FieldChange[] {
  return changedFields<T>({}, created, fields).filter(
    (change) => !(Array.isArray(change.after) && change.after.length === 0),
  );
}

/** One version of a record to write to the log. */
export interface ChangeEntry {
  readonly actor: Actor;
  readonly kind: RecordKind;
  readonly recordId: number;
  readonly version: number;
  readonly action: ChangeAction;
  readonly at: Date;
  readonly fields: readonly FieldChange[];
}

/**
 * The change log of customers, machine families and machines: who changed what, when. Each feature
 * writes its entry in the transaction of the change itself, so that no version is stored without one.
 */
export class ChangeLog {
  constructor(private readonly orm: Orm) {}

  /** Writes one entry; the unique index refuses a second entry for the same version. */
  record(entry: ChangeEntry): void {
    this.orm
      .insert(recordChanges)
      .values({
        organisationId: entry.actor.organisationId,
        entityKind: entry.kind,
        entityId: entry.recordId,
        version: entry.version,
        action: entry.action,
        userId: entry.actor.id,
        at: entry.at,
        fields: [...entry.fields],
      })
      .run();
  }

  /** Every change of one record of the organisation, newest first, with the name of who made it. */
  history(organisationId: number, kind: RecordKind, recordId: number): RecordHistory {
    const rows = this.orm
      .select({
        id: recordChanges.id,
        version: recordChanges.version,
        action: recordChanges.action,
        at: recordChanges.at,
        userId: recordChanges.userId,
        userName: users.name,
        fields: recordChanges.fields,
      })
      .from(recordChanges)
      .innerJoin(users, eq(users.id, recordChanges.userId))
      .where(
        and(
          eq(recordChanges.organisationId, organisationId),
          eq(recordChanges.entityKind, kind),
          eq(recordChanges.entityId, recordId),
        ),
      )
      .orderBy(desc(recordChanges.version))
      .all();
    return {
      changes: rows.map((row) => ({
        id: row.id,
        version: row.version,
        action: row.action,
        at: row.at.toISOString(),
        by: { id: row.userId, name: row.userName },
        fields: row.fields,
      })),
    };
  }
}
