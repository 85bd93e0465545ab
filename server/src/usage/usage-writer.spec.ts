import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { Database } from '../db/database';
import type { UsageRow } from '../http/keyed-request';
import { createTestKey } from '../keys/testing/test-keys';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { UsageLog } from './usage-log';

/* The usage log writing in a thread of its own, as the server runs it (main.ts). */

let temporary: TemporaryDatabase;
let keyId: number;
let usageLog: UsageLog | undefined;
beforeEach(() => {
  temporary = openTemporaryDatabase();
  keyId = createTestKey(temporary.database).record.id;
});
afterEach(() => {
  usageLog?.close();
  usageLog = undefined;
  temporary.dispose();
});

const stored = () =>
  temporary.database.sqlite.prepare('SELECT count(*) FROM api_usage').pluck().get() as number;

const row = (atMs: number): UsageRow => ({
  keyId,
  route: 'POST /api/v1/calc/batch',
  status: 200,
  calculations: 1,
  durationMs: 0.02,
  bytes: 410,
  at: new Date(atMs),
});

describe('UsageLog in a writer thread', { timeout: 30_000 }, () => {
  it('writes a flush before it returns, through its own connection', () => {
    usageLog = new UsageLog(temporary.database, { inWorker: true, flushIntervalMs: 60_000 });
    for (let i = 0; i < 1200; i++) usageLog.record(row(i));
    expect(usageLog.flush()).toBe(1200);
    expect(stored()).toBe(1200);
    expect(usageLog.pending).toBe(0);
  });

  it('writes full batches in the background, and what is left on close', async () => {
    usageLog = new UsageLog(temporary.database, { inWorker: true, batchSize: 100, flushIntervalMs: 60_000 });
    for (let i = 0; i < 250; i++) usageLog.record(row(i));
    await vi.waitFor(() => expect(stored()).toBe(250), { timeout: 10_000 });
    expect(usageLog.pending).toBe(0);
    for (let i = 250; i < 270; i++) usageLog.record(row(i));
    expect(usageLog.close()).toBe(20);
    expect(stored()).toBe(270);
  });

  it('keeps the rows of a failed write and writes them, once each, when the database works again', async () => {
    const messages: string[] = [];
    usageLog = new UsageLog(temporary.database, {
      inWorker: true,
      flushIntervalMs: 20,
      log: (message) => messages.push(message),
    });
    temporary.database.sqlite.exec(
      "CREATE TRIGGER refuse BEFORE INSERT ON api_usage BEGIN SELECT RAISE(ABORT, 'disk full'); END",
    );
    for (let i = 0; i < 5; i++) usageLog.record(row(i));
    expect(() => usageLog!.flush()).toThrow('disk full');
    expect(usageLog.pending).toBe(5);

    usageLog.record(row(5));
    await vi.waitFor(() => expect(messages).toEqual(['The usage log could not be written; 6 rows wait.']));
    temporary.database.sqlite.exec('DROP TRIGGER refuse');
    await vi.waitFor(() => expect(stored()).toBe(6), { timeout: 10_000 });
    expect(messages[1]).toMatch(/written again/);
    expect(usageLog.pending).toBe(0);
  });

  it('writes on the main thread, losing nothing, when the writer thread cannot start', async () => {
    const messages: string[] = [];
    // A database file the thread cannot open: its folder would be inside a file.
    const unopenable: Database = {
      orm: temporary.database.orm,
      sqlite: Object.create(temporary.database.sqlite, {
        name: { value: join(temporary.path, 'inside-a-file', 'usage.sqlite') },
        memory: { value: false },
      }),
    };
    usageLog = new UsageLog(unopenable, {
      inWorker: true,
      flushIntervalMs: 20,
      log: (message) => messages.push(message),
    });
    for (let i = 0; i < 3; i++) usageLog.record(row(i));
    await vi.waitFor(() => expect(stored()).toBe(3), { timeout: 10_000 });
    expect(messages[0]).toMatch(/writer thread failed/);
    usageLog.record(row(3));
    expect(usageLog.flush()).toBe(1);
    expect(stored()).toBe(4);
  });
});
