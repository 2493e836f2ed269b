import { describe, expect, it } from "vitest";
import { parseTrustedProxies, resolveClientAddress, settleForwardingHeaders } from "../../../scripts/client-address.mjs";

// Issue 11 row 4: a client-supplied X-Forwarded-For bypassed the per-address sign-in limit and put a
// forged address in the audit trail.
describe("the client address", () => {
  const none = parseTrustedProxies(undefined);
  const proxy = parseTrustedProxies("10.0.0.2, ::ffff:10.0.0.3");

  it("is the socket's peer when no proxy is trusted (the default), whatever the header says", () => {
    expect(resolveClientAddress("::ffff:192.0.2.50", "203.0.113.9", none)).toBe("192.0.2.50");
    const headers: Record<string, string> = { "x-forwarded-for": "203.0.113.9", "x-forwarded-host": "evil.example", "x-real-ip": "1.2.3.4" };
    expect(settleForwardingHeaders(headers, "192.0.2.50", none)).toBe("192.0.2.50");
    expect(headers).toEqual({ "x-forwarded-for": "192.0.2.50" });
  });

  it("is what a trusted proxy forwards: the nearest hop that is not a trusted proxy", () => {
    expect(resolveClientAddress("10.0.0.2", "198.51.100.7", proxy)).toBe("198.51.100.7");
    // The client prepended a forged entry; the proxy appended the real one.
    expect(resolveClientAddress("10.0.0.2", "203.0.113.9, 198.51.100.7", proxy)).toBe("198.51.100.7");
    expect(resolveClientAddress("10.0.0.2", "198.51.100.7, 10.0.0.3", proxy)).toBe("198.51.100.7");
    const headers: Record<string, string> = { "x-forwarded-for": "198.51.100.7", "x-forwarded-proto": "https" };
    settleForwardingHeaders(headers, "10.0.0.2", proxy);
    expect(headers).toEqual({ "x-forwarded-for": "198.51.100.7", "x-forwarded-proto": "https" });
  });
});
