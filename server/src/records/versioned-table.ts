import { and, eq, sql } from 'drizzle-orm';
import type { SQLiteUpdateSetSource } from 'drizzle-orm/sqlite-core';
import type { Orm } from '../db/database';
import type { customers, machineFamilies, machines } from '../db/schema';

/** The tables of the versioned records: each has an organisation and the columns of `recordLifecycle()`. */
export type RecordTable = typeof customers | typeof machineFamilies | typeof machines;

/** The columns the shared writes set themselves, never a feature's values. */
type LifecycleColumn = 'id' | 'organisationId' | 'version' | 'createdAt' | 'updatedAt' | 'archivedAt';

/** The columns a create or a change of a record writes: its fields and the keys derived from them. */
export type RecordValues<T extends RecordTable> = Omit<T['$inferInsert'], LifecycleColumn>;

/**
 * The writes that customers, machine families and machines store alike (see `RecordStore`): insert at
 * version 1, and write or archive only where the stored version is still the one read, adding one to
 * it in the same statement. A feature's repo extends it with its own reads: what a row shows, and its
 * list.
 */
export abstract class VersionedTable<T extends RecordTable> {
  constructor(
    protected readonly orm: Orm,
    private readonly table: T,
  ) {}

  /** Runs `work` in one write transaction, taken at its start so that no other writer slips between. */
  transaction<R>(work: () => R): R {
    return this.orm.transaction(() => work(), { behavior: 'immediate' });
  }

  /** Inserts a record at version 1 and returns its id. */
  insert(organisationId: number, values: RecordValues<T>, at: Date): number {
    // The values and the lifecycle columns make a whole row: `RecordValues` leaves out exactly these.
    const row = { ...values, organisationId, version: 1, createdAt: at, updatedAt: at, archivedAt: null };
    return this.orm
      .insert(this.table)
      .values(row as T['$inferInsert'])
      .returning({ id: this.table.id })
      .get().id;
  }

  /** Whether the record was still at `version` and now holds `values`. */
  writeAtVersion(
    organisationId: number,
    id: number,
    version: number,
    values: RecordValues<T>,
    at: Date,
  ): boolean {
    return this.updateAtVersion(organisationId, id, version, { ...values, updatedAt: at });
  }

  /** Archives (a date) or restores (null) the record, if it was still at `version`. */
  setArchivedAt(
    organisationId: number,
    id: number,
    version: number,
    archivedAt: Date | null,
    at: Date,
  ): boolean {
    return this.updateAtVersion(organisationId, id, version, { archivedAt, updatedAt: at });
  }

  /** Writes `set` and the next version, only where the stored version is still `version`. */
  private updateAtVersion(
    organisationId: number,
    id: number,
    version: number,
    set: Partial<RecordValues<T>> | Pick<RecordTable['$inferInsert'], 'archivedAt' | 'updatedAt'>,
  ): boolean {
    const table: RecordTable = this.table;
    // Every column named is one of T's: a feature's values by `RecordValues`, the rest by `RecordTable`.
    const next = { ...set, version: sql`${table.version} + 1` } as SQLiteUpdateSetSource<T>;
    return (
      this.orm
        .update(this.table)
        .set(next)
        .where(and(eq(table.id, id), eq(table.organisationId, organisationId), eq(table.version, version)))
        .run().changes === 1
    );
  }
}
