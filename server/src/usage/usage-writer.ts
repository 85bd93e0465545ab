import { MessageChannel, type MessagePort, receiveMessageOnPort, Worker } from 'node:worker_threads';
import type { Database } from '../db/database';
import { type PackedUsageRows, UsageRepo } from './usage.repo';

/** How the usage log's batches reach SQLite. */
export interface UsageBatchWriter {
  /** Starts writing a batch; `done` is called once, with the error when the batch was not stored. */
  write(batch: PackedUsageRows, done: (error?: unknown) => void): void;
  /** Blocks until every write started has called its `done`. */
  drain(): void;
  /** Rows handed to `write` whose `done` has not been called yet. */
  readonly inFlightRows: number;
  /** Drains, then lets go of what the writer holds (a thread, say). */
  close(): void;
}

/** Writes on the calling thread, through Drizzle: `done` is called before `write` returns. */
export function inThreadWriter(repo: UsageRepo): UsageBatchWriter {
  return {
    write(batch, done) {
      try {
        repo.insertPacked(batch);
      } catch (error) {
        done(error);
        return;
      }
      done();
    },
    drain: () => undefined,
    inFlightRows: 0,
    close: () => undefined,
  };
}

/** What the writer's thread is given: the database file and the port it answers on. */
export interface UsageWriterWorkerData {
  readonly path: string;
  readonly port: MessagePort;
  /** One Int32 the thread adds 1 to after each answer, so that a blocked `drain()` wakes. */
  readonly signal: SharedArrayBuffer;
}

/** A batch sent to the writer's thread, and its answer. */
export interface UsageWriteRequest {
  readonly seq: number;
  readonly batch: PackedUsageRows;
}
export interface UsageWriteAnswer {
  readonly seq: number;
  readonly error?: string;
}

/**
 * The thread's entry: from the sources (tsx, vitest), a small `.mjs` that registers tsx in the thread
 * before it loads `usage-writer.thread.ts`; in the compiled server (`scripts/build-server.mjs`), the
 * compiled thread beside the bundle, which needs no loader.
 */
const THREAD_ENTRY = import.meta.url.endsWith('.ts')
  ? new URL('./usage-writer.worker.mjs', import.meta.url)
  : new URL('./usage-writer.thread.js', import.meta.url);

/** The longest `drain()` blocks the event loop for a thread that does not answer. */
const DRAIN_LIMIT_MS = 10_000;

/**
 * Writes in a thread of its own, with its own connection to the SQLite file (WAL lets it write while
 * the server's connection reads), so that inserting the rows of a busy minute never holds up the event
 * loop that answers requests. The rows travel as one JSON string per batch (`packUsageRows`), the
 * cheapest thing to hand across. `drain()` blocks on a shared counter the thread bumps after each
 * answer, so that a flush at shutdown, or in a test, returns with everything stored.
 *
 * Should the thread fail (it cannot start, or it dies), the batches it held are failed, and so kept by
 * the usage log, and every later batch is written on the calling thread instead: slower, never lost.
 */
export class WorkerUsageWriter implements UsageBatchWriter {
  private readonly worker: Worker;
  private readonly port: MessagePort;
  private readonly signal: Int32Array;
  private readonly outstanding = new Map<number, { rows: number; done: (error?: unknown) => void }>();
  private readonly fallback: UsageBatchWriter;
  private nextSeq = 1;
  private broken: Error | undefined;
  private closed = false;

  constructor(
    database: Database,
    private readonly log: (message: string, error?: unknown) => void,
  ) {
    this.fallback = inThreadWriter(new UsageRepo(database.orm));
    const { port1, port2 } = new MessageChannel();
    const shared = new SharedArrayBuffer(4);
    this.signal = new Int32Array(shared);
    this.port = port1;
    const workerData: UsageWriterWorkerData = { path: database.sqlite.name, port: port2, signal: shared };
    this.worker = new Worker(THREAD_ENTRY, {
      workerData,
      transferList: [port2],
      execArgv: [],
    });
    this.port.on('message', (answer: UsageWriteAnswer) => this.settle(answer));
    this.worker.on('error', (error) => this.fail(error));
    this.worker.on('exit', (code) => {
      if (!this.closed) this.fail(new Error(`The usage writer's thread stopped (exit code ${code}).`));
    });
    // Neither keeps the process alive: the usage log's own timer and close() decide when it ends.
    this.worker.unref();
    this.port.unref();
  }

  get inFlightRows(): number {
    let rows = 0;
    for (const entry of this.outstanding.values()) rows += entry.rows;
    return rows;
  }

  write(batch: PackedUsageRows, done: (error?: unknown) => void): void {
    if (this.broken !== undefined || this.closed) {
      this.fallback.write(batch, done);
      return;
    }
    const seq = this.nextSeq++;
    this.outstanding.set(seq, { rows: batch.count, done });
    const request: UsageWriteRequest = { seq, batch };
    this.port.postMessage(request);
  }

  drain(): void {
    const deadline = Date.now() + DRAIN_LIMIT_MS;
    while (this.outstanding.size > 0) {
      const seen = Atomics.load(this.signal, 0);
      for (
        let message = receiveMessageOnPort(this.port);
        message;
        message = receiveMessageOnPort(this.port)
      ) {
        this.settle(message.message as UsageWriteAnswer);
      }
      if (this.outstanding.size === 0) return;
      if (Date.now() > deadline) {
        this.fail(new Error(`The usage writer's thread did not answer within ${DRAIN_LIMIT_MS} ms.`));
        return;
      }
      Atomics.wait(this.signal, 0, seen, 50);
    }
  }

  close(): void {
    this.drain();
    this.closed = true;
    this.port.close();
    void this.worker.terminate();
  }

  private settle(answer: UsageWriteAnswer): void {
    const entry = this.outstanding.get(answer.seq);
    if (entry === undefined) return;
    this.outstanding.delete(answer.seq);
    entry.done(answer.error === undefined ? undefined : new Error(answer.error));
  }

  /** Fails what the thread held, and writes on this thread from now on. */
  private fail(error: Error): void {
    if (this.broken !== undefined) return;
    this.broken = error;
    this.log('The usage writer thread failed; usage rows are written on the main thread from now on.', error);
    const held = [...this.outstanding.values()];
    this.outstanding.clear();
    for (const entry of held) entry.done(error);
    void this.worker.terminate();
  }
}
