import { ACCOUNTS_PROBLEM_CODES } from '@counterpoise/api';
import { TooManyRequests } from './too-many-requests';

/** How many password hashes the gate lets compute at once, and how many it lets wait. */
export interface HashGateLimits {
  /** Hashes computed at the same time. */
  readonly maxRunning: number;
  /** Hashes waiting for a place; one more is refused at once. */
  readonly maxWaiting: number;
}

/**
 * Two hashes at once leave the other two threads of libuv's pool (file reads, DNS) free, and keep the
 * memory of scrypt at its default cost (32 MiB a hash) to 64 MiB. Twenty waiting is about a second of
 * work at that cost: a shop's morning sign-ins pass, a flood is refused early.
 */
export const DEFAULT_HASH_GATE_LIMITS: HashGateLimits = { maxRunning: 2, maxWaiting: 20 };

/** What a refused request is told to wait: a few hashes' time, rounded up to whole seconds. */
export const HASH_GATE_RETRY_AFTER_SECONDS = 1;

/** The 429 of a request that found every place taken. */
export class HashGateFull extends TooManyRequests {
  constructor() {
    super(
      `The server is checking too many passwords at once. Try again in ${HASH_GATE_RETRY_AFTER_SECONDS} s.`,
      ACCOUNTS_PROBLEM_CODES.passwordChecksBusy,
      HASH_GATE_RETRY_AFTER_SECONDS,
    );
  }
}

/**
 * Lets only a few password hashes (scrypt, deliberately slow and memory-hungry) compute at once, with
 * a bounded queue behind them. Without it, a flood of sign-ins fills libuv's thread pool and the
 * memory with hashes and every other request waits; with it, the flood is answered 429 and the rest of
 * the server keeps its pace.
 */
export class HashGate {
  private running = 0;
  private readonly waiting: (() => void)[] = [];

  constructor(readonly limits: HashGateLimits = DEFAULT_HASH_GATE_LIMITS) {
    if (!(limits.maxRunning >= 1) || !(limits.maxWaiting >= 0)) {
      throw new RangeError('A hash gate needs at least one running place and no negative queue.');
    }
  }

  /** Whether `run` would refuse work now: every place is taken and the queue is full. */
  get full(): boolean {
    return this.running >= this.limits.maxRunning && this.waiting.length >= this.limits.maxWaiting;
  }

  /**
   * Runs `work` once a place is free; rejects at once with `HashGateFull` when the gate is full.
   * The place is given back however `work` ends.
   */
  async run<T>(work: () => Promise<T>): Promise<T> {
    if (this.running >= this.limits.maxRunning) {
      if (this.waiting.length >= this.limits.maxWaiting) throw new HashGateFull();
      // The place is handed over by the one leaving, so `running` never drops between two holders.
      await new Promise<void>((resolve) => this.waiting.push(resolve));
    } else {
      this.running++;
    }
    try {
      return await work();
    } finally {
      const next = this.waiting.shift();
      if (next) next();
      else this.running--;
    }
  }
}
