import type { RecordHistory } from '@counterpoise/api';
import type { Clock } from '../clock';
import type { Actor, ChangeLog } from './change-log';
import type { ListWindow } from './list-query';
import type { RecordRoutesService } from './record-routes';
import {
  type RecordKindOptions,
  type RecordStore,
  type StoredRecord,
  VersionedRecords,
} from './versioned-records';

/** One page of a list as the API shows it (`pageSchema` in shared/api/records.ts). */
export interface RecordPage<Rec> {
  items: Rec[];
  total: number;
  page: number;
  pageSize: number;
}

/** A store that also lists the organisation's records: one page, and how many match in all. */
export interface ListingStore<Row, Values, Query> extends RecordStore<Row, Values> {
  list(organisationId: number, query: Query): { rows: Row[]; total: number };
}

/**
 * The service of one kind of record as its routes call it. Listing, reading, archiving, restoring and
 * the history are alike for customers, machine families and machines, and live here; a feature's
 * service writes only `create` and `update`, where its own rules are.
 */
export abstract class RecordService<
  Row,
  Rec extends StoredRecord & Fields,
  Fields extends object,
  Values,
  Create,
  Update,
  Query extends Pick<ListWindow, 'page' | 'pageSize'>,
> implements RecordRoutesService<Rec, RecordPage<Rec>, Create, Update, Query> {
  protected readonly records: VersionedRecords<Row, Rec, Fields, Values>;

  constructor(
    private readonly kindOptions: RecordKindOptions<Row, Rec, Fields, Values> & {
      readonly store: ListingStore<Row, Values, Query>;
    },
    changes: ChangeLog,
    clock: Clock,
  ) {
    this.records = new VersionedRecords(kindOptions, changes, clock);
  }

  abstract create(actor: Actor, fields: Create): Rec;

  abstract update(actor: Actor, id: number, versions: readonly number[], change: Update): Rec;

  list(actor: Actor, query: Query): RecordPage<Rec> {
    const { rows, total } = this.kindOptions.store.list(actor.organisationId, query);
    return {
      items: rows.map(this.kindOptions.toRecord),
      total,
      page: query.page,
      pageSize: query.pageSize,
    };
  }

  get(actor: Actor, id: number): Rec {
    return this.records.get(actor, id);
  }

  archive(actor: Actor, id: number, versions: readonly number[]): Rec {
    return this.records.archive(actor, id, versions);
  }

  restore(actor: Actor, id: number, versions: readonly number[]): Rec {
    return this.records.restore(actor, id, versions);
  }

  history(actor: Actor, id: number): RecordHistory {
    return this.records.history(actor, id);
  }
}
