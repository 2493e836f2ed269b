import { describe, expect, it } from "vitest";
import { rateWindowStart, refuseTokenUse, TOKEN_MAX_DAYS, tokenCoversRun, tokenExpiry } from "@/lib/machine-tokens/token-policy";

const now = new Date("2026-12-05T09:30:00Z");

describe("a token's expiry", () => {
  it("is the given number of whole days from issue, 1 to a year", () => {
    expect(tokenExpiry(now, 90).toISOString()).toBe("2027-03-05T09:30:00.000Z");
    expect(tokenExpiry(now, 1).toISOString()).toBe("2026-12-06T09:30:00.000Z");
    expect(tokenExpiry(now, TOKEN_MAX_DAYS).toISOString()).toBe("2027-12-05T09:30:00.000Z");
    for (const bad of [0, -1, 1.5, TOKEN_MAX_DAYS + 1, Number.NaN]) expect(() => tokenExpiry(now, bad)).toThrow(RangeError);
  });
});

describe("a known token may be used", () => {
  const fresh = { expiresAt: new Date("2027-01-01T00:00:00Z"), revokedAt: null, revokeReason: null };

  it("until it expires, to the millisecond", () => {
    expect(refuseTokenUse(fresh, now)).toBeNull();
    expect(refuseTokenUse(fresh, new Date("2026-12-31T23:59:59.999Z"))).toBeNull();
    const refused = refuseTokenUse(fresh, new Date("2027-01-01T00:00:00Z"));
    expect(refused?.code).toBe("expired");
    expect(refused?.message).toBe("This token expired on 2027-01-01. Ask the lab's administrator for a new one.");
  });

  it("never once revoked, whatever its expiry, and the refusal gives the reason", () => {
    const refused = refuseTokenUse({ ...fresh, revokedAt: new Date("2026-12-01T10:00:00Z"), revokeReason: "PC replaced" }, now);
    expect(refused?.code).toBe("revoked");
    expect(refused?.message).toContain("revoked on 2026-12-01 (PC replaced)");
  });
});

describe("scope and rate", () => {
  it("covers a run only when the run uses the token's channel", () => {
    expect(tokenCoversRun("ch-1", ["thermo", "ch-1"])).toBe(true);
    expect(tokenCoversRun("ch-2", ["thermo", "ch-1"])).toBe(false);
    expect(tokenCoversRun("ch-1", [])).toBe(false);
  });

  it("counts requests per whole minute", () => {
    expect(rateWindowStart(new Date("2026-12-05T09:30:59.999Z")).toISOString()).toBe("2026-12-05T09:30:00.000Z");
    expect(rateWindowStart(new Date("2026-12-05T09:31:00.000Z")).toISOString()).toBe("2026-12-05T09:31:00.000Z");
  });
});
