import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { UsageRow } from '../http/keyed-request';
import { createTestKey } from '../keys/testing/test-keys';
import { apiKeys } from '../db/schema';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { UsageLog } from './usage-log';

let temporary: TemporaryDatabase;
let keyId: number;
beforeEach(() => {
  vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'setImmediate', 'clearImmediate'] });
  temporary = openTemporaryDatabase();
  keyId = createTestKey(temporary.database).record.id;
});
afterEach(() => {
  vi.useRealTimers();
  temporary.dispose();
});

const stored = () =>
  temporary.database.sqlite.prepare('SELECT count(*) FROM api_usage').pluck().get() as number;

const row = (atMs: number, status = 200): UsageRow => ({
  keyId,
  route: 'POST /api/v1/calc/single-plane',
  status,
  calculations: 1,
  durationMs: 0.75,
  bytes: 180,
  at: new Date(atMs),
});

describe('UsageLog', () => {
  it('keeps rows in memory until the flush interval, then writes them in one go', () => {
    const log = new UsageLog(temporary.database, { flushIntervalMs: 100, batchSize: 500 });
    log.record(row(1));
    log.record(row(2));
    expect(log.pending).toBe(2);
    expect(stored()).toBe(0);

    vi.advanceTimersByTime(99);
    expect(stored()).toBe(0);
    vi.advanceTimersByTime(1);
    expect(stored()).toBe(2);
    expect(log.pending).toBe(0);
  });

  it('writes a full batch at the next turn of the event loop, without waiting for the interval', () => {
    const log = new UsageLog(temporary.database, { flushIntervalMs: 60_000, batchSize: 3 });
    log.record(row(1));
    log.record(row(2));
    log.record(row(3));
    expect(stored()).toBe(0);
    vi.advanceTimersToNextTimer();
    expect(stored()).toBe(3);
  });

  it('stores every field of a row and moves the key’s last use forward, never back', () => {
    const log = new UsageLog(temporary.database);
    log.record({ ...row(Date.UTC(2026, 4, 4, 10)), status: 422, durationMs: 1.25, bytes: 321 });
    log.record(row(Date.UTC(2026, 4, 4, 9)));
    expect(log.flush()).toBe(2);

    const first = temporary.database.sqlite
      .prepare('SELECT key_id, route, status, duration_ms, bytes, at FROM api_usage ORDER BY id LIMIT 1')
      .get();
    expect(first).toEqual({
      key_id: keyId,
      route: 'POST /api/v1/calc/single-plane',
      status: 422,
      duration_ms: 1.25,
      bytes: 321,
      at: Date.UTC(2026, 4, 4, 10),
    });
    const lastUsedAt = () => temporary.database.orm.select().from(apiKeys).get()?.lastUsedAt;
    expect(lastUsedAt()).toEqual(new Date(Date.UTC(2026, 4, 4, 10)));

    log.record(row(Date.UTC(2026, 4, 4, 8)));
    log.flush();
    expect(lastUsedAt()).toEqual(new Date(Date.UTC(2026, 4, 4, 10)));
  });

  it('stores routes and figures exactly as recorded, whatever characters a junk path holds', () => {
    const log = new UsageLog(temporary.database);
    const routes = [
      'GET /api/v1/"quoted"\\back\\slash',
      'GET /api/v1/ünïcødé/✓/\u2028',
      'POST /api/v1/calc/x',
    ];
    routes.forEach((route, index) =>
      log.record({ ...row(1000 + index), route, durationMs: index === 2 ? 2 : 0.1 + index, bytes: 2 ** 40 }),
    );
    expect(log.flush()).toBe(3);
    const rows = temporary.database.sqlite
      .prepare(
        'SELECT route, typeof(duration_ms) AS durationType, duration_ms, bytes, at FROM api_usage ORDER BY id',
      )
      .all();
    expect(rows).toEqual([
      { route: routes[0], durationType: 'real', duration_ms: 0.1, bytes: 2 ** 40, at: 1000 },
      { route: routes[1], durationType: 'real', duration_ms: 1.1, bytes: 2 ** 40, at: 1001 },
      { route: routes[2], durationType: 'real', duration_ms: 2, bytes: 2 ** 40, at: 1002 },
    ]);
  });

  it('keeps the rows of a failed write and writes them, once each, when the database works again', () => {
    const messages: string[] = [];
    const log = new UsageLog(temporary.database, {
      flushIntervalMs: 100,
      log: (message) => messages.push(message),
    });
    temporary.database.sqlite.exec(
      "CREATE TRIGGER refuse BEFORE INSERT ON api_usage BEGIN SELECT RAISE(ABORT, 'disk full'); END",
    );
    for (let i = 0; i < 5; i++) log.record(row(i));

    expect(() => log.flush()).toThrow('disk full');
    expect(log.pending).toBe(5);
    log.record(row(5));
    vi.advanceTimersByTime(100);
    vi.advanceTimersByTime(100);
    expect(log.pending).toBe(6);
    expect(stored()).toBe(0);
    expect(messages).toEqual(['The usage log could not be written; 6 rows wait.']);

    temporary.database.sqlite.exec('DROP TRIGGER refuse');
    vi.advanceTimersByTime(100);
    expect(stored()).toBe(6);
    expect(log.pending).toBe(0);
    expect(messages[1]).toMatch(/written again/);
    const times = temporary.database.sqlite.prepare('SELECT at FROM api_usage ORDER BY at').pluck().all();
    expect(times).toEqual([0, 1, 2, 3, 4, 5]);
  });

  it('writes what is left on close, and at once whatever is recorded after', () => {
    const log = new UsageLog(temporary.database, { flushIntervalMs: 60_000 });
    log.record(row(1));
    log.record(row(2));
    expect(log.close()).toBe(2);
    expect(stored()).toBe(2);
    log.record(row(3));
    expect(stored()).toBe(3);
    expect(vi.getTimerCount()).toBe(0);
  });

  it('flushes nothing when nothing waits', () => {
    const log = new UsageLog(temporary.database);
    expect(log.flush()).toBe(0);
    expect(log.close()).toBe(0);
  });
});
