import { type DBSchema, type IDBPDatabase, openDB } from 'idb';
import type {
  CorrectionDisagreement,
  DiscardedChanges,
  JobConflict,
  KeptRecord,
  NewQueuedChange,
  OfflineStorage,
  QueuedChange,
} from './offline-storage';

/** The database's name; its version changes with its stores. */
const DATABASE = 'counterpoise-offline';

interface OfflineDatabase extends DBSchema {
  /** Waiting changes; the auto-incremented key is the order they were made in. */
  changes: { key: number; value: QueuedChange; indexes: { byUser: number } };
  conflicts: { key: [number, number]; value: JobConflict; indexes: { byUser: number } };
  disagreements: {
    key: [number, number, number];
    value: CorrectionDisagreement;
    indexes: { byUser: number };
  };
  discarded: { key: number; value: DiscardedChanges; indexes: { byUser: number } };
  records: { key: [number, string]; value: KeptRecord; indexes: { byUser: number } };
}

/** What the device keeps for working with no connection, in IndexedDB through `idb`. */
export class IdbOfflineStorage implements OfflineStorage {
  private database: Promise<IDBPDatabase<OfflineDatabase>> | null = null;

  private db(): Promise<IDBPDatabase<OfflineDatabase>> {
    this.database ??= openDB<OfflineDatabase>(DATABASE, 1, {
      upgrade(db) {
        db.createObjectStore('changes', { keyPath: 'key', autoIncrement: true }).createIndex(
          'byUser',
          'userId',
        );
        db.createObjectStore('conflicts', { keyPath: ['userId', 'jobId'] }).createIndex('byUser', 'userId');
        db.createObjectStore('disagreements', {
          keyPath: ['userId', 'jobId', 'correctionSequence'],
        }).createIndex('byUser', 'userId');
        db.createObjectStore('discarded', { keyPath: 'key', autoIncrement: true }).createIndex(
          'byUser',
          'userId',
        );
        db.createObjectStore('records', { keyPath: ['userId', 'url'] }).createIndex('byUser', 'userId');
      },
    });
    return this.database;
  }

  async changes(userId: number): Promise<QueuedChange[]> {
    const all = await (await this.db()).getAllFromIndex('changes', 'byUser', userId);
    return all.sort((a, b) => a.key - b.key);
  }
  async addChange(change: NewQueuedChange): Promise<QueuedChange> {
    // The key is left out so that IndexedDB gives the next one.
    const key = await (await this.db()).add('changes', change as QueuedChange);
    return { ...change, key };
  }
  async putChange(change: QueuedChange): Promise<void> {
    await (await this.db()).put('changes', change);
  }
  async removeChange(key: number): Promise<void> {
    await (await this.db()).delete('changes', key);
  }
  async conflicts(userId: number): Promise<JobConflict[]> {
    return (await this.db()).getAllFromIndex('conflicts', 'byUser', userId);
  }
  async putConflict(conflict: JobConflict): Promise<void> {
    await (await this.db()).put('conflicts', conflict);
  }
  async removeConflict(userId: number, jobId: number): Promise<void> {
    await (await this.db()).delete('conflicts', [userId, jobId]);
  }
  async disagreements(userId: number): Promise<CorrectionDisagreement[]> {
    return (await this.db()).getAllFromIndex('disagreements', 'byUser', userId);
  }
  async putDisagreement(disagreement: CorrectionDisagreement): Promise<void> {
    await (await this.db()).put('disagreements', disagreement);
  }
  async removeDisagreement(userId: number, jobId: number, correctionSequence: number): Promise<void> {
    await (await this.db()).delete('disagreements', [userId, jobId, correctionSequence]);
  }
  async discarded(userId: number): Promise<DiscardedChanges[]> {
    return (await this.db()).getAllFromIndex('discarded', 'byUser', userId);
  }
  async addDiscarded(discarded: Omit<DiscardedChanges, 'key'>): Promise<DiscardedChanges> {
    const key = await (await this.db()).add('discarded', discarded as DiscardedChanges);
    return { ...discarded, key };
  }
  async removeDiscarded(key: number): Promise<void> {
    await (await this.db()).delete('discarded', key);
  }
  async readRecord(userId: number, url: string): Promise<KeptRecord | null> {
    return (await (await this.db()).get('records', [userId, url])) ?? null;
  }
  async writeRecord(record: KeptRecord): Promise<void> {
    await (await this.db()).put('records', record);
  }
  async clearRecords(userId: number): Promise<void> {
    const db = await this.db();
    const transaction = db.transaction('records', 'readwrite');
    let cursor = await transaction.store.index('byUser').openCursor(userId);
    while (cursor) {
      await cursor.delete();
      cursor = await cursor.continue();
    }
    await transaction.done;
  }
}
