import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { computeNextAttemptAt, computeRetryDelayMs, MAX_RETRY_DELAY_MS, MAX_SEND_ATTEMPTS } from "@/lib/mail/retry-backoff";

const MIN = 60_000;

describe("computeRetryDelayMs", () => {
  it("doubles from one minute after each failure, then stays at six hours", () => {
    const delays = Array.from({ length: 12 }, (_, i) => computeRetryDelayMs(i + 1) / MIN);
    expect(delays).toEqual([1, 2, 4, 8, 16, 32, 64, 128, 256, 360, 360, 360]);
  });

  it("never shrinks and never passes the cap, however many failures", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 10_000 }), (n) => {
        const d = computeRetryDelayMs(n);
        expect(d).toBeLessThanOrEqual(MAX_RETRY_DELAY_MS);
        expect(computeRetryDelayMs(n + 1)).toBeGreaterThanOrEqual(d);
      }),
    );
  });

  it("refuses a count that is not a failure count", () => {
    expect(() => computeRetryDelayMs(0)).toThrow(RangeError);
    expect(() => computeRetryDelayMs(1.5)).toThrow(RangeError);
  });
});

describe("computeNextAttemptAt", () => {
  const now = new Date("2026-12-02T10:00:00Z");

  it("sets the next try one minute after the first failure", () => {
    expect(computeNextAttemptAt(1, now)?.toISOString()).toBe("2026-12-02T10:01:00.000Z");
  });

  it("gives up at the last allowed attempt, after about 20 h of trying", () => {
    expect(computeNextAttemptAt(MAX_SEND_ATTEMPTS - 1, now)).not.toBeNull();
    expect(computeNextAttemptAt(MAX_SEND_ATTEMPTS, now)).toBeNull();
    const waited = Array.from({ length: MAX_SEND_ATTEMPTS - 1 }, (_, i) => computeRetryDelayMs(i + 1)).reduce((a, b) => a + b, 0);
    expect(waited / MIN).toBe(1 + 2 + 4 + 8 + 16 + 32 + 64 + 128 + 256 + 360 + 360);
  });
});
