import type { Job, JobCorrection } from '@counterpoise/api';
import type { OfflineJobChange } from './local-rules';

/** Why the server refused a waiting change: its status and its words, kept until the person acts. */
export interface QueuedRefusal {
  readonly status: number;
  readonly message: string;
  /** The field messages of the server's problem, if any. */
  readonly fields: readonly string[];
}

/** A change of a job made with no connection, waiting on the device to be sent. */
export interface QueuedChange {
  /** Its place in the device's queue (given by the storage): changes are sent in this order. */
  readonly key: number;
  /** The person who made it: only they send it. */
  readonly userId: number;
  readonly jobId: number;
  readonly change: OfflineJobChange;
  /** What it is, in words ("Readings of run 3"). */
  readonly what: string;
  /** When it was made (ISO). */
  readonly queuedAt: string;
  /** The version of the job as stored on the server that the change was made on. */
  readonly baseVersion: number;
  /** The job on the device once the change is applied (the local rules' answer). */
  readonly after: Job;
  /** Set when the server refused it (400, 403, 409…): the job's queue stops here until the person acts. */
  readonly refusal: QueuedRefusal | null;
}

/** A waiting change before the storage gives it its place. */
export type NewQueuedChange = Omit<QueuedChange, 'key'>;

/** The job changed on the server while the device held changes for it (a 412 while sending). */
export interface JobConflict {
  readonly userId: number;
  readonly jobId: number;
  /** The job as stored on the server now, with its ETag. */
  readonly current: Job;
  readonly etag: string;
  /** When the device met the conflict (ISO). */
  readonly seenAt: string;
}

/** The server's stored correction and the device's disagree: shown, not hidden. */
export interface CorrectionDisagreement {
  readonly userId: number;
  readonly jobId: number;
  readonly correctionSequence: number;
  /** The differences in words (`compareCorrections`). */
  readonly differences: readonly string[];
  readonly device: JobCorrection;
  readonly server: JobCorrection;
  /** When it was found (ISO). */
  readonly foundAt: string;
}

/** Changes the person chose to discard: kept for them to read until they dismiss them. */
export interface DiscardedChanges {
  readonly key: number;
  readonly userId: number;
  readonly jobId: number;
  readonly changes: readonly { readonly what: string; readonly queuedAt: string }[];
  readonly discardedAt: string;
}

/** A read answer kept for when the connection fails: per person and address. */
export interface KeptRecord {
  readonly userId: number;
  readonly url: string;
  readonly body: unknown;
  readonly etag: string | null;
  readonly storedAt: string;
}

/**
 * What the device keeps for working with no connection. The browser keeps it in IndexedDB
 * (`IdbOfflineStorage`); the specs use `MemoryOfflineStorage`, which keeps the same rules in a few maps.
 */
export interface OfflineStorage {
  /** The person's waiting changes, in the order they were made. */
  changes(userId: number): Promise<QueuedChange[]>;
  addChange(change: NewQueuedChange): Promise<QueuedChange>;
  putChange(change: QueuedChange): Promise<void>;
  removeChange(key: number): Promise<void>;

  conflicts(userId: number): Promise<JobConflict[]>;
  putConflict(conflict: JobConflict): Promise<void>;
  removeConflict(userId: number, jobId: number): Promise<void>;

  disagreements(userId: number): Promise<CorrectionDisagreement[]>;
  putDisagreement(disagreement: CorrectionDisagreement): Promise<void>;
  removeDisagreement(userId: number, jobId: number, correctionSequence: number): Promise<void>;

  discarded(userId: number): Promise<DiscardedChanges[]>;
  addDiscarded(discarded: Omit<DiscardedChanges, 'key'>): Promise<DiscardedChanges>;
  removeDiscarded(key: number): Promise<void>;

  readRecord(userId: number, url: string): Promise<KeptRecord | null>;
  writeRecord(record: KeptRecord): Promise<void>;
  /** Forgets every read answer kept for the person (at sign-out); waiting changes stay. */
  clearRecords(userId: number): Promise<void>;
}

/** The storage in memory, with the same keys and order as IndexedDB's (for specs). */
export class MemoryOfflineStorage implements OfflineStorage {
  private nextKey = 1;
  private readonly queued = new Map<number, QueuedChange>();
  private readonly conflictMap = new Map<string, JobConflict>();
  private readonly disagreementMap = new Map<string, CorrectionDisagreement>();
  private readonly discardedMap = new Map<number, DiscardedChanges>();
  private readonly records = new Map<string, KeptRecord>();

  async changes(userId: number): Promise<QueuedChange[]> {
    return [...this.queued.values()].filter((c) => c.userId === userId).sort((a, b) => a.key - b.key);
  }
  async addChange(change: NewQueuedChange): Promise<QueuedChange> {
    const stored = { ...structuredClone(change), key: this.nextKey++ };
    this.queued.set(stored.key, stored);
    return structuredClone(stored);
  }
  async putChange(change: QueuedChange): Promise<void> {
    this.queued.set(change.key, structuredClone(change));
  }
  async removeChange(key: number): Promise<void> {
    this.queued.delete(key);
  }
  async conflicts(userId: number): Promise<JobConflict[]> {
    return [...this.conflictMap.values()].filter((c) => c.userId === userId);
  }
  async putConflict(conflict: JobConflict): Promise<void> {
    this.conflictMap.set(`${conflict.userId}/${conflict.jobId}`, structuredClone(conflict));
  }
  async removeConflict(userId: number, jobId: number): Promise<void> {
    this.conflictMap.delete(`${userId}/${jobId}`);
  }
  async disagreements(userId: number): Promise<CorrectionDisagreement[]> {
    return [...this.disagreementMap.values()].filter((d) => d.userId === userId);
  }
  async putDisagreement(d: CorrectionDisagreement): Promise<void> {
    this.disagreementMap.set(`${d.userId}/${d.jobId}/${d.correctionSequence}`, structuredClone(d));
  }
  async removeDisagreement(userId: number, jobId: number, correctionSequence: number): Promise<void> {
    this.disagreementMap.delete(`${userId}/${jobId}/${correctionSequence}`);
  }
  async discarded(userId: number): Promise<DiscardedChanges[]> {
    return [...this.discardedMap.values()].filter((d) => d.userId === userId);
  }
  async addDiscarded(discarded: Omit<DiscardedChanges, 'key'>): Promise<DiscardedChanges> {
    const stored = { ...structuredClone(discarded), key: this.nextKey++ };
    this.discardedMap.set(stored.key, stored);
    return stored;
  }
  async removeDiscarded(key: number): Promise<void> {
    this.discardedMap.delete(key);
  }
  async readRecord(userId: number, url: string): Promise<KeptRecord | null> {
    return structuredClone(this.records.get(`${userId} ${url}`) ?? null);
  }
  async writeRecord(record: KeptRecord): Promise<void> {
    this.records.set(`${record.userId} ${record.url}`, structuredClone(record));
  }
  async clearRecords(userId: number): Promise<void> {
    for (const [key, record] of this.records) if (record.userId === userId) this.records.delete(key);
  }
}
