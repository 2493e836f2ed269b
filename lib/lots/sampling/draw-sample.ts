import { sample } from "simple-statistics";
import { createSeededRandom } from "@/lib/analysis/seeded-random";
import { refuse, type SamplingInputError } from "./sampling-error";

export interface DrawSampleInput {
  /** The identifiers of every specimen in the lot, in any order. */
  specimenIds: readonly string[];
  /** How many to draw: the plan's sample size. */
  n: number;
  /** A whole number from 0 to 4 294 967 295, recorded with the draw so anyone can repeat it. */
  seed: number;
}

export interface SampleDraw {
  /** The drawn identifiers, in the order they were drawn. */
  drawn: string[];
  seed: number;
  n: number;
  lotCount: number;
  /** How the draw was made, in words, for the lot record. */
  method: string;
}

export type SampleDrawResult = { ok: true; draw: SampleDraw } | { ok: false; error: SamplingInputError };

const maxSeed = 2 ** 32 - 1;

function checkInput({ specimenIds, n, seed }: DrawSampleInput): SamplingInputError | null {
  if (specimenIds.length === 0) return { field: "specimenIds", message: "The lot has no specimens to draw from." };
  if (new Set(specimenIds).size !== specimenIds.length) {
    return { field: "specimenIds", message: "The specimen identifiers must be distinct; the lot lists one of them twice." };
  }
  if (!Number.isInteger(n) || n < 1) return { field: "n", message: `The number to draw must be a whole number, at least 1 (got ${String(n)}).` };
  if (n > specimenIds.length) {
    return { field: "n", message: `Cannot draw ${n} specimens from a lot of ${specimenIds.length}: test the whole lot instead.` };
  }
  if (!Number.isInteger(seed) || seed < 0 || seed > maxSeed) {
    return { field: "seed", message: `The seed must be a whole number from 0 to ${maxSeed} (got ${String(seed)}).` };
  }
  return null;
}

/**
 * A simple random sample without replacement that anyone can repeat from the recorded seed: the
 * identifiers are put in code-unit order (so the database's row order does not matter), shuffled by
 * simple-statistics' Fisher–Yates `sample` driven by mulberry32 (T. Ettinger, public domain) from
 * the seed, and the first n are taken.
 */
export function drawSample(input: DrawSampleInput): SampleDrawResult {
  const problem = checkInput(input);
  if (problem) return refuse(problem.field, problem.message);
  const { specimenIds, n, seed } = input;
  const ordered = [...specimenIds].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
  const random = createSeededRandom(seed);
  const drawn = sample(ordered, n, random.nextUniform);
  const method =
    `${n} of ${specimenIds.length} specimens drawn without replacement: identifiers sorted, shuffled by Fisher–Yates ` +
    `(simple-statistics sample) with the mulberry32 generator seeded with ${seed}, first ${n} taken.`;
  return { ok: true, draw: { drawn, seed, n, lotCount: specimenIds.length, method } };
}
