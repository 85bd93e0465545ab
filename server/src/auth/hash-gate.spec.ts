import { describe, expect, it } from 'vitest';
import { HashGate, HashGateFull } from './hash-gate';

/** A piece of work that stays running until the test finishes it. */
function pending<T>() {
  let finish!: (value: T) => void;
  let fail!: (error: Error) => void;
  const done = new Promise<T>((resolve, reject) => {
    finish = resolve;
    fail = reject;
  });
  return { done, finish, fail };
}

const settle = () => new Promise((resolve) => setImmediate(resolve));

describe('HashGate', () => {
  it('runs at most maxRunning at once, queues maxWaiting, and refuses the rest at once', async () => {
    const gate = new HashGate({ maxRunning: 2, maxWaiting: 1 });
    const started: number[] = [];
    const works = [0, 1, 2].map(() => pending<string>());
    const runs = works.map((work, index) =>
      gate.run(() => {
        started.push(index);
        return work.done;
      }),
    );
    await settle();
    expect(started).toEqual([0, 1]);
    expect(gate.full).toBe(true);

    const refused = gate.run(() => Promise.resolve('never'));
    await expect(refused).rejects.toBeInstanceOf(HashGateFull);
    await expect(refused).rejects.toMatchObject({
      status: 429,
      code: 'PASSWORD_CHECKS_BUSY',
      retryAfterSeconds: 1,
    });

    works[0]!.finish('first');
    await expect(runs[0]).resolves.toBe('first');
    await settle();
    // The place left by the first went to the one waiting, not to a newcomer.
    expect(started).toEqual([0, 1, 2]);
    expect(gate.full).toBe(false);
    works[1]!.finish('second');
    works[2]!.finish('third');
    await expect(Promise.all(runs)).resolves.toEqual(['first', 'second', 'third']);
  });

  it('gives the place back when the work fails', async () => {
    const gate = new HashGate({ maxRunning: 1, maxWaiting: 0 });
    const failing = pending<string>();
    const run = gate.run(() => failing.done);
    expect(gate.full).toBe(true);
    failing.fail(new Error('scrypt failed'));
    await expect(run).rejects.toThrow('scrypt failed');
    expect(gate.full).toBe(false);
    await expect(gate.run(() => Promise.resolve('next'))).resolves.toBe('next');
  });

  it('needs at least one place', () => {
    expect(() => new HashGate({ maxRunning: 0, maxWaiting: 5 })).toThrow(RangeError);
  });
});
