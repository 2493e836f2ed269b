import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { hashTokenSecret, looksLikeToken, makeTokenSecret, readBearerToken, TOKEN_PREFIX } from "@/lib/machine-tokens/token-secret";

describe("a token's secret", () => {
  it("is the prefix and 43 base64url characters of 32 random bytes", () => {
    const bytes = Uint8Array.from({ length: 32 }, (_, i) => i * 7);
    const { token, sha256, hint } = makeTokenSecret(() => bytes);
    expect(token).toBe(TOKEN_PREFIX + Buffer.from(bytes).toString("base64url"));
    expect(token).toHaveLength(4 + 43);
    expect(looksLikeToken(token)).toBe(true);
    expect(hint).toBe(token.slice(0, 10));
    expect(sha256).toBe(createHash("sha256").update(token).digest("hex"));
  });

  it("is different every time and stored only as its SHA-256", () => {
    const a = makeTokenSecret();
    const b = makeTokenSecret();
    expect(a.token).not.toBe(b.token);
    expect(a.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(a.sha256).not.toContain(a.token.slice(4));
    expect(hashTokenSecret(a.token)).toBe(a.sha256);
    expect(hashTokenSecret(`${a.token} `)).not.toBe(a.sha256);
  });

  it("is recognised only in its own shape", () => {
    expect(looksLikeToken("cwt_" + "A".repeat(42))).toBe(false);
    expect(looksLikeToken("cwt_" + "A".repeat(44))).toBe(false);
    expect(looksLikeToken("xyz_" + "A".repeat(43))).toBe(false);
    expect(looksLikeToken("cwt_" + "A".repeat(42) + "+")).toBe(false);
  });

  it("is read from a Bearer header only", () => {
    expect(readBearerToken("Bearer cwt_abc")).toBe("cwt_abc");
    expect(readBearerToken("bearer   cwt_abc ")).toBe("cwt_abc");
    expect(readBearerToken("Basic dXNlcjpwYXNz")).toBeNull();
    expect(readBearerToken("Bearer a b")).toBeNull();
    expect(readBearerToken(null)).toBeNull();
    expect(readBearerToken("")).toBeNull();
  });
});
