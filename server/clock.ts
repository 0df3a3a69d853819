/**
 * The server's clock. Rules that depend on elapsed time (the admin's cooling period before it may
 * decide a review) read it from here, so a test can move time forward without waiting.
 */
export interface Clock {
  /** Milliseconds since the Unix epoch. */
  now(): number;
}

export const systemClock: Clock = { now: () => Date.now() };
