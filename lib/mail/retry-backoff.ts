/**
 * When a failed message is tried again. The delay doubles after each failure, from one minute up to
 * six hours (exponential backoff, common practice for mail relays); after MAX_SEND_ATTEMPTS the
 * sender gives up and the message stays in the outbox, marked as given up, for an admin to see.
 */
export const MAX_SEND_ATTEMPTS = 12;
export const FIRST_RETRY_DELAY_MS = 60_000;
export const MAX_RETRY_DELAY_MS = 6 * 60 * 60_000;

/** Delay before the next try after `failedAttempts` failures (≥ 1): 1 min × 2^(failedAttempts − 1), at most 6 h. */
export function computeRetryDelayMs(failedAttempts: number): number {
  if (!Number.isInteger(failedAttempts) || failedAttempts < 1) throw new RangeError(`failedAttempts must be a whole number ≥ 1, not ${failedAttempts}`);
  // Past 2^9 min the cap applies anyway; stopping the exponent there keeps the number finite.
  const exponent = Math.min(failedAttempts - 1, 20);
  return Math.min(FIRST_RETRY_DELAY_MS * 2 ** exponent, MAX_RETRY_DELAY_MS);
}

/** The moment of the next try, or null when this failure was the last allowed attempt. */
export function computeNextAttemptAt(failedAttempts: number, now: Date): Date | null {
  if (failedAttempts >= MAX_SEND_ATTEMPTS) return null;
  return new Date(now.getTime() + computeRetryDelayMs(failedAttempts));
}
