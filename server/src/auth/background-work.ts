import { setImmediate as afterIo } from 'node:timers/promises';

/**
 * Work that a route starts once it has answered, such as looking up an address and sending it a reset
 * e-mail: the answer then neither waits for it nor tells by its timing what the work found. A failure is
 * logged, never thrown at a request. `settled()` waits for what is under way: at shutdown, before the
 * database closes; in tests, before looking at what was sent.
 */
export class BackgroundWork {
  private readonly underWay = new Set<Promise<void>>();

  constructor(private readonly log: (message: string, error?: unknown) => void) {}

  /** Starts `work` after the current request's answer has been written; `failure` is logged if it throws. */
  start(failure: string, work: () => Promise<void> | void): void {
    const task: Promise<void> = afterIo()
      .then(work)
      .catch((error: unknown) => this.log(failure, error))
      .finally(() => this.underWay.delete(task));
    this.underWay.add(task);
  }

  /** Resolves once every piece of work started so far (and any it started meanwhile) has ended. */
  async settled(): Promise<void> {
    while (this.underWay.size > 0) await Promise.all(this.underWay);
  }
}
