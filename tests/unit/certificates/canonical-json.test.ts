import { createHash } from "node:crypto";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { hashCanonicalJson, toCanonicalJson } from "@/lib/certificates/canonical-json";

describe("toCanonicalJson", () => {
  it("sorts keys at every depth, keeps array order, writes no whitespace and leaves out undefined properties", () => {
    const value = { b: 1, a: { d: [3, { z: true, y: null }], c: "x" }, u: undefined };
    expect(toCanonicalJson(value)).toBe('{"a":{"c":"x","d":[3,{"y":null,"z":true}]},"b":1}');
  });

  it("sorts keys by UTF-16 code units, not by locale", () => {
    expect(toCanonicalJson({ é: 1, z: 2, Z: 3, "10": 4, "9": 5 })).toBe('{"10":4,"9":5,"Z":3,"z":2,"é":1}');
  });

  it("refuses what is not plain JSON: NaN, Infinity, dates, bigints, cycles", () => {
    expect(() => toCanonicalJson({ x: Number.NaN })).toThrow(/\$\.x is NaN/);
    expect(() => toCanonicalJson([Infinity])).toThrow(/finite/);
    expect(() => toCanonicalJson({ at: new Date(0) })).toThrow(/Date/);
    expect(() => toCanonicalJson({ n: BigInt(1) })).toThrow(/bigint/);
    const loop: Record<string, unknown> = {};
    loop.self = loop;
    expect(() => toCanonicalJson(loop)).toThrow(/refers back/);
  });

  it("hashes the UTF-8 bytes of the canonical text with SHA-256", () => {
    const text = '{"a":"Ω","b":[1,2]}';
    expect(hashCanonicalJson({ b: [1, 2], a: "Ω" })).toBe(createHash("sha256").update(Buffer.from(text, "utf8")).digest("hex"));
  });

  it("gives the same text whatever the key order, and survives a JSON round trip (as jsonb does to a payload)", () => {
    const json = fc.jsonValue().filter((v) => !Object.is(v, -0));
    fc.assert(
      fc.property(json, (value) => {
        const text = toCanonicalJson(value);
        const reordered = JSON.parse(JSON.stringify(value, (_k, v: unknown) => (v && typeof v === "object" && !Array.isArray(v) ? Object.fromEntries(Object.entries(v).reverse()) : v)));
        expect(toCanonicalJson(reordered)).toBe(text);
        expect(toCanonicalJson(JSON.parse(text))).toBe(text);
      }),
      { numRuns: 300 },
    );
  });
});
