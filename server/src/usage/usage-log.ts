import type { Database } from '../db/database';
import type { UsageRow, UsageSink } from '../http/keyed-request';
import { UsageRepo } from './usage.repo';

/** How the usage log batches its writes. */
export interface UsageLogOptions {
  /** The longest a row waits in memory before its batch is written. */
  readonly flushIntervalMs?: number;
  /** A batch this large is written at the next turn of the event loop, without waiting. */
  readonly batchSize?: number;
  /** Where a failed write is reported; the rows stay queued and the write is tried again. */
  readonly log?: (message: string, error?: unknown) => void;
}

/**
 * The usage log: `record()` only queues the row in memory, so that a response never waits on the
 * disk; batches are written in one Drizzle transaction each, every `flushIntervalMs` or as soon as
 * `batchSize` rows wait. A write that fails keeps its rows queued for the next attempt, so a busy or
 * briefly locked database loses nothing. At shutdown, after the server has let the requests under
 * way finish, `close()` writes what is left.
 */
export class UsageLog implements UsageSink {
  private queue: UsageRow[] = [];
  private timer: NodeJS.Timeout | undefined;
  private immediate: NodeJS.Immediate | undefined;
  private closed = false;
  private failing = false;
  private readonly repo: UsageRepo;
  private readonly flushIntervalMs: number;
  private readonly batchSize: number;
  private readonly log: (message: string, error?: unknown) => void;

  constructor(database: Database, options: UsageLogOptions = {}) {
    this.repo = new UsageRepo(database.orm);
    this.flushIntervalMs = options.flushIntervalMs ?? 100;
    this.batchSize = options.batchSize ?? 500;
    this.log = options.log ?? ((message, error) => console.error(message, error));
  }

  /** Rows recorded but not yet written. */
  get pending(): number {
    return this.queue.length;
  }

  /** Queues one row; after `close()`, writes it at once, since no flush would follow. */
  record(row: UsageRow): void {
    this.queue.push(row);
    if (this.closed) {
      this.flushInBackground();
    } else if (this.queue.length >= this.batchSize) {
      this.immediate ??= setImmediate(this.flushInBackground);
    } else {
      this.timer ??= setTimeout(this.flushInBackground, this.flushIntervalMs).unref();
    }
  }

  /**
   * Writes every queued row now, in one transaction, and returns how many. Throws when the write
   * fails; the rows are then still queued.
   */
  flush(): number {
    this.cancelScheduled();
    const rows = this.queue;
    if (rows.length === 0) return 0;
    this.queue = [];
    try {
      this.repo.insertBatch(rows);
    } catch (error) {
      this.queue = rows.concat(this.queue);
      throw error;
    }
    return rows.length;
  }

  /** Writes what is left and stops the timers; throws, with the rows still queued, if that fails. */
  close(): number {
    this.closed = true;
    return this.flush();
  }

  private readonly flushInBackground = (): void => {
    try {
      this.flush();
      if (this.failing) this.log('The usage log is written again; no rows were lost.');
      this.failing = false;
    } catch (error) {
      // Said once, not every 100 ms; the rows wait for the next attempt.
      if (!this.failing)
        this.log(`The usage log could not be written; ${this.queue.length} rows wait.`, error);
      this.failing = true;
      if (!this.closed) this.timer ??= setTimeout(this.flushInBackground, this.flushIntervalMs).unref();
    }
  };

  private cancelScheduled(): void {
    if (this.timer) clearTimeout(this.timer);
    if (this.immediate) clearImmediate(this.immediate);
    this.timer = undefined;
    this.immediate = undefined;
  }
}
