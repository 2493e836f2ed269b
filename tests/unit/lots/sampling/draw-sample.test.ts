import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { createSeededRandom } from "@/lib/analysis/seeded-random";
import { drawSample } from "@/lib/lots/sampling";

const lot = Array.from({ length: 12 }, (_, k) => `S-${String(k + 1).padStart(3, "0")}`);

function draw(specimenIds: readonly string[], n: number, seed: number) {
  const result = drawSample({ specimenIds, n, seed });
  if (!result.ok) throw new Error(result.error.message);
  return result.draw;
}

describe("drawSample", () => {
  it("gives the same draw for the same seed, whatever order the lot is listed in", () => {
    const first = draw(lot, 5, 20240611);
    expect(draw(lot, 5, 20240611).drawn).toEqual(first.drawn);
    expect(draw([...lot].reverse(), 5, 20240611).drawn).toEqual(first.drawn);
  });

  // Recorded from this implementation, so that a change of generator or of simple-statistics' shuffle
  // (which would make recorded draws unrepeatable) fails here first.
  it("is pinned for seed 1", () => {
    expect(draw(lot, 5, 1).drawn).toEqual(["S-005", "S-011", "S-003", "S-007", "S-010"]);
  });

  // Durstenfeld's form of the Fisher–Yates shuffle (Knuth, TAOCP vol. 2, 3.4.2, Algorithm P), written out
  // here independently and fed the same mulberry32 stream, gives the same draw.
  it("matches a textbook Fisher–Yates shuffle driven by the same generator", () => {
    for (const seed of [0, 1, 99, 2 ** 32 - 1]) {
      const ids = [...lot].sort();
      const random = createSeededRandom(seed);
      for (let i = ids.length - 1; i >= 1; i--) {
        const j = Math.floor(random.nextUniform() * (i + 1));
        [ids[i], ids[j]] = [ids[j] as string, ids[i] as string];
      }
      expect(draw(lot, 7, seed).drawn).toEqual(ids.slice(0, 7));
    }
  });

  it("draws differently with another seed", () => {
    expect(draw(lot, 5, 2).drawn).not.toEqual(draw(lot, 5, 1).drawn);
  });

  it("records how the draw was made", () => {
    const { method, seed, lotCount } = draw(lot, 3, 42);
    expect({ seed, lotCount }).toEqual({ seed: 42, lotCount: 12 });
    expect(method).toContain("mulberry32");
    expect(method).toContain("Fisher–Yates");
    expect(method).toContain("seeded with 42");
  });

  it("never repeats a specimen, always returns n, and only specimens of the lot", () => {
    const input = fc
      .uniqueArray(fc.string({ minLength: 1, maxLength: 8 }), { minLength: 1, maxLength: 60 })
      .chain((ids) => fc.record({ ids: fc.constant(ids), n: fc.integer({ min: 1, max: ids.length }), seed: fc.nat({ max: 2 ** 32 - 1 }) }));
    fc.assert(
      fc.property(input, ({ ids, n, seed }) => {
        const { drawn } = draw(ids, n, seed);
        expect(drawn).toHaveLength(n);
        expect(new Set(drawn).size).toBe(n);
        for (const id of drawn) expect(ids).toContain(id);
      }),
      { seed: 4242, numRuns: 500 },
    );
  });

  it("draws the whole lot when n equals its size", () => {
    expect([...draw(lot, 12, 7).drawn].sort()).toEqual(lot);
  });

  it.each([
    [{ n: 13 }, "n", "Cannot draw 13 specimens from a lot of 12"],
    [{ n: 0 }, "n", "at least 1"],
    [{ n: 2.5 }, "n", "whole number"],
    [{ seed: -1 }, "seed", "from 0 to 4294967295"],
    [{ seed: 2 ** 32 }, "seed", "from 0 to 4294967295"],
    [{ seed: 1.5 }, "seed", "whole number"],
    [{ specimenIds: [] }, "specimenIds", "no specimens"],
    [{ specimenIds: ["a", "b", "a"] }, "specimenIds", "distinct"],
  ])("refuses %o", (overrides, field, words) => {
    const result = drawSample({ specimenIds: lot, n: 3, seed: 1, ...overrides });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.error.field).toBe(field);
    expect(result.error.message).toContain(words);
  });
});
