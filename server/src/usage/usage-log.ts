import type { Database } from '../db/database';
import type { UsageRow, UsageSink } from '../http/keyed-request';
import { inThreadWriter, type UsageBatchWriter, WorkerUsageWriter } from './usage-writer';
import { packUsageRows, UsageRepo } from './usage.repo';

/** How the usage log batches its writes. */
export interface UsageLogOptions {
  /** The longest a row waits in memory before its batch is written. */
  readonly flushIntervalMs?: number;
  /** A batch this large is written at the next turn of the event loop, without waiting. */
  readonly batchSize?: number;
  /** Where a failed write is reported; the rows stay queued and the write is tried again. */
  readonly log?: (message: string, error?: unknown) => void;
  /**
   * Write the batches in a thread of their own (`WorkerUsageWriter`), off the event loop: what the
   * server does. Off by default, so that a test sees a batch stored as soon as its timer fires; an
   * in-memory database is always written on the calling thread.
   */
  readonly inWorker?: boolean;
}

/**
 * The usage log: `record()` only queues the row in memory, so that a response never waits on the
 * disk; batches are written in one Drizzle transaction each, every `flushIntervalMs` or as soon as
 * `batchSize` rows wait, on this thread or (`inWorker`) in a thread of their own. A write that fails
 * keeps its rows queued for the next attempt, so a busy or briefly locked database loses nothing. At
 * shutdown, after the server has let the requests under way finish, `close()` writes what is left.
 */
export class UsageLog implements UsageSink {
  private queue: UsageRow[] = [];
  private timer: NodeJS.Timeout | undefined;
  private immediate: NodeJS.Immediate | undefined;
  private closed = false;
  private failing = false;
  private failures = 0;
  private lastFailure: unknown;
  private readonly writer: UsageBatchWriter;
  private readonly flushIntervalMs: number;
  private readonly batchSize: number;
  private readonly log: (message: string, error?: unknown) => void;

  constructor(database: Database, options: UsageLogOptions = {}) {
    this.flushIntervalMs = options.flushIntervalMs ?? 100;
    this.batchSize = options.batchSize ?? 500;
    this.log = options.log ?? ((message, error) => console.error(message, error));
    this.writer =
      options.inWorker === true && !database.sqlite.memory
        ? new WorkerUsageWriter(database, this.log)
        : inThreadWriter(new UsageRepo(database.orm));
  }

  /** Rows recorded but not yet written. */
  get pending(): number {
    return this.queue.length + this.writer.inFlightRows;
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
   * Writes every queued row now, in one transaction, waits for the batches already on their way, and
   * returns how many rows it wrote. Throws when a write fails; its rows are then queued again.
   */
  flush(): number {
    this.cancelScheduled();
    const failuresBefore = this.failures;
    const count = this.queue.length;
    this.writeQueued(false);
    this.writer.drain();
    if (this.failures > failuresBefore) throw this.lastFailure;
    return count;
  }

  /** Writes what is left and stops the timers; throws, with the rows still queued, if that fails. */
  close(): number {
    this.closed = true;
    try {
      return this.flush();
    } finally {
      this.writer.close();
    }
  }

  /**
   * Hands the queue to the writer; rows of a batch that fails come back to the queue. A failed
   * background write is logged (once, until one succeeds); `flush()` throws its failure instead.
   */
  private writeQueued(background: boolean): void {
    const rows = this.queue;
    if (rows.length === 0) return;
    this.queue = [];
    this.writer.write(packUsageRows(rows), (error) => {
      if (error === undefined) {
        if (this.failing) this.log('The usage log is written again; no rows were lost.');
        this.failing = false;
        return;
      }
      this.queue = rows.concat(this.queue);
      this.failures++;
      this.lastFailure = error;
      if (!background) return;
      // Said once, not every 100 ms; the rows wait for the next attempt.
      if (!this.failing)
        this.log(`The usage log could not be written; ${this.queue.length} rows wait.`, error);
      this.failing = true;
      if (!this.closed) this.timer ??= setTimeout(this.flushInBackground, this.flushIntervalMs).unref();
    });
  }

  private readonly flushInBackground = (): void => {
    this.cancelScheduled();
    this.writeQueued(true);
  };

  private cancelScheduled(): void {
    if (this.timer) clearTimeout(this.timer);
    if (this.immediate) clearImmediate(this.immediate);
    this.timer = undefined;
    this.immediate = undefined;
  }
}
