/** The source of the current time, passed in so that tests can fix it. */
export interface Clock {
  now(): Date;
}

/** The clock of the machine. */
export const systemClock: Clock = { now: () => new Date() };
