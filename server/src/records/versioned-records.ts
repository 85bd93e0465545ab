import type { RecordHistory } from '@counterpoise/api';
import type { Clock } from '../clock';
import { HttpProblem } from '../http/problem';
import {
  type Actor,
  type ChangeAction,
  type ChangeLog,
  changedFields,
  type FieldChange,
  initialFields,
  type RecordKind,
} from './change-log';
import { ChangedMeanwhile, checkVersion } from './versions';

/** What every record of the shop shows besides its own fields. */
export interface StoredRecord {
  readonly id: number;
  readonly version: number;
  readonly archivedAt: string | null;
}

/**
 * The storage of one kind of record, as the shared change flow needs it. Every method reads and writes
 * the organisation's rows only. `writeAtVersion` and `setArchivedAt` check the version in the statement
 * that writes (`UPDATE … WHERE id = ? AND organisation_id = ? AND version = ?`) and add one to it: the
 * flow below checks the version first, to answer with the stored record, but the statement is what
 * makes exactly one of many changes on one version win, whatever runs around it.
 */
export interface RecordStore<Row, Values> {
  /** Runs `work` in one write transaction, taken at its start so that no other writer slips between. */
  transaction<T>(work: () => T): T;
  find(organisationId: number, id: number): Row | undefined;
  /** Inserts a record at version 1 and returns its id. */
  insert(organisationId: number, values: Values, at: Date): number;
  /** Whether the record was still at `version` and is now written. */
  writeAtVersion(organisationId: number, id: number, version: number, values: Values, at: Date): boolean;
  /** Archives (a date) or restores (null) the record, if it was still at `version`. */
  setArchivedAt(
    organisationId: number,
    id: number,
    version: number,
    archivedAt: Date | null,
    at: Date,
  ): boolean;
}

/** How one kind of record is named, stored and shown. */
export interface RecordKindOptions<Row, Rec, Fields, Values> {
  readonly kind: RecordKind;
  /** The record's name in a sentence ("customer", "machine family"). */
  readonly noun: string;
  /** The fields a person edits, in the order the history lists them. */
  readonly fields: readonly (keyof Fields & string)[];
  readonly store: RecordStore<Row, Values>;
  readonly toRecord: (row: Row) => Rec;
  readonly toValues: (fields: Fields) => Values;
}

/** What every record shows besides its own fields, as the API writes it: the dates as ISO text. */
export function lifecycleOf(row: {
  readonly id: number;
  readonly version: number;
  readonly createdAt: Date;
  readonly updatedAt: Date;
  readonly archivedAt: Date | null;
}): { id: number; version: number; createdAt: string; updatedAt: string; archivedAt: string | null } {
  return {
    id: row.id,
    version: row.version,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    archivedAt: row.archivedAt?.toISOString() ?? null,
  };
}

/** `current` with every field that `change` holds put in (a field left out stays as it is). */
export function withChange<F extends object>(current: F, change: Partial<F>): F {
  const next = { ...current };
  for (const key of Object.keys(change) as (keyof F)[]) {
    const value = change[key];
    if (value !== undefined) next[key] = value as F[keyof F];
  }
  return next;
}

/**
 * Free text that may be left empty (notes, an address) as it is stored: null when nothing but spaces
 * was typed, so that an emptied box and one never filled read the same in lists and in the history.
 */
export function textOrNull(text: string | null | undefined): string | null {
  return text === undefined || text === null || text.trim() === '' ? null : text;
}

/** The editable fields of a record as it is now. */
function fieldsOf<F>(record: F, fields: readonly (keyof F & string)[]): F {
  return Object.fromEntries(fields.map((field) => [field, record[field]])) as F;
}

/**
 * What customers, machine families and machines do alike: read one of the organisation's records
 * (another organisation's is not found, never forbidden, so that nothing tells it exists), create it,
 * change it on the version the client read, archive and restore it, and write each of these to the
 * change log in the same transaction. A feature adds its own rules through `prepare`.
 */
export class VersionedRecords<Row, Rec extends StoredRecord & Fields, Fields extends object, Values> {
  constructor(
    private readonly options: RecordKindOptions<Row, Rec, Fields, Values>,
    private readonly changes: ChangeLog,
    private readonly clock: Clock,
  ) {}

  /** One record of the actor's organisation, or 404. */
  get(actor: Actor, id: number): Rec {
    const row = this.options.store.find(actor.organisationId, id);
    if (row === undefined) {
      throw new HttpProblem(404, 'Not Found', `There is no ${this.options.noun} ${id} in your organisation.`);
    }
    return this.options.toRecord(row);
  }

  /**
   * Creates a record at version 1 and logs it as created, with the fields it started with. `prepare`
   * may refuse the fields (400) or settle what depends on them, in the transaction that stores them.
   */
  create(actor: Actor, fields: Fields, prepare: (fields: Fields) => Fields = (same) => same): Rec {
    const { store, kind, toValues } = this.options;
    return store.transaction(() => {
      const prepared = prepare(fields);
      const at = this.clock.now();
      const id = store.insert(actor.organisationId, toValues(prepared), at);
      const created = this.get(actor, id);
      this.changes.record({
        actor,
        kind,
        recordId: id,
        version: created.version,
        action: 'created',
        at,
        fields: initialFields(created, this.options.fields),
      });
      return created;
    });
  }

  /**
   * Changes the fields that `change` holds, if the record is still at one of `versions` (412 with the
   * stored record otherwise). `prepare` sees the record as it would be and may refuse it (400) or settle
   * what depends on it. A change that changes nothing is answered with the record as it is, without a
   * new version.
   */
  update(
    actor: Actor,
    id: number,
    versions: readonly number[],
    change: Partial<Fields>,
    prepare: (next: Fields, current: Rec) => Fields = (next) => next,
  ): Rec {
    const { store, noun, fields, toValues } = this.options;
    return store.transaction(() => {
      const current = this.get(actor, id);
      checkVersion(current, versions, noun);
      const next = prepare(withChange(fieldsOf<Fields>(current, fields), change), current);
      if (changedFields<Fields>(current, next, fields).length === 0) return current;
      return this.written(
        actor,
        id,
        'updated',
        (at) => store.writeAtVersion(actor.organisationId, id, current.version, toValues(next), at),
        (updated) => changedFields<Fields>(current, updated, fields),
      );
    });
  }

  /** Archives the record (it stays, with its history); archiving an archived record changes nothing. */
  archive(actor: Actor, id: number, versions: readonly number[]): Rec {
    return this.setArchived(actor, id, versions, true);
  }

  /** Puts an archived record back in use; restoring one in use changes nothing. */
  restore(actor: Actor, id: number, versions: readonly number[]): Rec {
    return this.setArchived(actor, id, versions, false);
  }

  /** The record's changes, newest first (404 for a record that is not the organisation's). */
  history(actor: Actor, id: number): RecordHistory {
    this.get(actor, id);
    return this.changes.history(actor.organisationId, this.options.kind, id);
  }

  private setArchived(actor: Actor, id: number, versions: readonly number[], archived: boolean): Rec {
    const { store, noun } = this.options;
    return store.transaction(() => {
      const current = this.get(actor, id);
      checkVersion(current, versions, noun);
      if ((current.archivedAt !== null) === archived) return current;
      return this.written(
        actor,
        id,
        archived ? 'archived' : 'restored',
        (at) => store.setArchivedAt(actor.organisationId, id, current.version, archived ? at : null, at),
        (updated) => [{ field: 'archivedAt', before: current.archivedAt, after: updated.archivedAt }],
      );
    });
  }

  /**
   * The tail of a change or an archive, in its transaction: `write` writes on the version read (412
   * with the stored record when another change came first), and the change log gets `fields` of the
   * record as it now is.
   */
  private written(
    actor: Actor,
    id: number,
    action: Exclude<ChangeAction, 'created'>,
    write: (at: Date) => boolean,
    fields: (updated: Rec) => FieldChange[],
  ): Rec {
    const at = this.clock.now();
    if (!write(at)) throw new ChangedMeanwhile(this.get(actor, id), this.options.noun);
    const updated = this.get(actor, id);
    this.changes.record({
      actor,
      kind: this.options.kind,
      recordId: id,
      version: updated.version,
      action,
      at,
      fields: fields(updated),
    });
    return updated;
  }
}
