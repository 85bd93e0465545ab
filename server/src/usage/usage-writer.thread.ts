/*
 * The usage log's writer thread (see WorkerUsageWriter; started through usage-writer.worker.mjs): its own connection to the SQLite file, one
 * Drizzle transaction per batch, an answer per batch on the port, and a bump of the shared counter so
 * that a blocked drain() wakes.
 */
import { workerData } from 'node:worker_threads';
import { openDatabase } from '../db/database';
import { UsageRepo } from './usage.repo';
import type { UsageWriteAnswer, UsageWriteRequest, UsageWriterWorkerData } from './usage-writer';

const { path, port, signal } = workerData as UsageWriterWorkerData;
const database = openDatabase(path);
const repo = new UsageRepo(database.orm);
const answered = new Int32Array(signal);

port.on('message', ({ seq, batch }: UsageWriteRequest) => {
  let answer: UsageWriteAnswer;
  try {
    repo.insertPacked(batch);
    answer = { seq };
  } catch (error) {
    answer = { seq, error: error instanceof Error ? error.message : String(error) };
  }
  port.postMessage(answer);
  Atomics.add(answered, 0, 1);
  Atomics.notify(answered, 0);
});

port.on('close', () => {
  if (database.sqlite.open) database.sqlite.close();
});
