import { describe, expect, it } from "vitest";
import { classifyMailState, describeMailState } from "@/lib/mail/describe-mail-state";
import { MAX_SEND_ATTEMPTS } from "@/lib/mail/retry-backoff";

const iso = (d: Date) => d.toISOString();
const base = { sentAt: null, attempts: 0, nextAttemptAt: new Date("2026-12-02T10:05:00Z"), lastError: null };

describe("describeMailState", () => {
  it("says when a message went", () => {
    const m = { ...base, attempts: 2, sentAt: new Date("2026-12-02T10:03:00Z") };
    expect(classifyMailState(m)).toBe("sent");
    expect(describeMailState(m, iso)).toBe("sent at 2026-12-02T10:03:00.000Z");
  });

  it("says a new message is waiting, and a failed one which attempt failed and when it goes again", () => {
    expect(describeMailState(base, iso)).toBe("waiting to be sent (first try at 2026-12-02T10:05:00.000Z)");
    const retrying = { ...base, attempts: 3, lastError: "connect ECONNREFUSED" };
    expect(classifyMailState(retrying)).toBe("retrying");
    expect(describeMailState(retrying, iso)).toBe(`waiting: attempt 3 of ${MAX_SEND_ATTEMPTS} failed, next try at 2026-12-02T10:05:00.000Z`);
  });

  it("says the sender gave up once every attempt has failed", () => {
    const m = { ...base, attempts: MAX_SEND_ATTEMPTS, lastError: "550 mailbox unavailable" };
    expect(classifyMailState(m)).toBe("gave-up");
    expect(describeMailState(m, iso)).toBe(`gave up after ${MAX_SEND_ATTEMPTS} attempts`);
  });
});
