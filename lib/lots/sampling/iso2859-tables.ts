/**
 * Sampling tables of ISO 2859-1:1999, single sampling by attributes: Table 1 (sample size code
 * letters) and Table 2-A (single sampling plans for normal inspection). The same tables are
 * printed in ANSI/ASQ Z1.4 and in MIL-STD-105E (Tables I and II-A there).
 *
 * Where these values come from, honestly:
 * - They were written from memory of the public tables, not copied from the standard's text.
 * - Checked against docs/references.md §10 (published values): the level II column of Table 1 for all
 *   15 lot-size ranges, the sample sizes of code letters A to Q, and the Table 2-A cells H 1.0,
 *   H 0.65 (arrow down), J 0.65, G 0.65 (arrow up), F 0.65, E 1.0 and L 1.0.
 * - Recalled from memory: the other six columns of Table 1, the sample size of R (2 000) and every
 *   other Table 2-A cell. Table 2-A is built on one pattern: a cell depends only on how many rows
 *   and columns it lies from the top-left corner (both the sample sizes and the AQLs grow by
 *   about 10^(1/5) a step), so each diagonal carries one plan; tests/unit/sampling checks the data
 *   keeps that pattern.
 * - Least sure, at the table's edges where the pattern cannot continue: A at AQL 10 (recalled as
 *   an arrow down: there is no row above A) and R at AQL 0.015 (an arrow up: there is no row below
 *   R). Verify these two against the standard before relying on them.
 * - Only the AQL columns 0.010 to 10 (percent nonconforming, the ones cell testing uses) are
 *   offered. The standard's columns 15 to 1 000 (nonconformities per hundred items) are not: their
 *   upper rows (Ac 30 and 44) could not be recalled reliably.
 */

export const inspectionLevels = ["S-1", "S-2", "S-3", "S-4", "I", "II", "III"] as const;
export type InspectionLevel = (typeof inspectionLevels)[number];

/** The code letters in order; I and O are not used. */
export const codeLetters = ["A", "B", "C", "D", "E", "F", "G", "H", "J", "K", "L", "M", "N", "P", "Q", "R"] as const;
export type CodeLetter = (typeof codeLetters)[number];

export interface LotSizeRange {
  from: number;
  /** Inclusive upper end; null for the last range ("500 001 and over"). */
  to: number | null;
  codeLetters: Readonly<Record<InspectionLevel, CodeLetter>>;
}

type Table1Row = readonly [from: number, to: number | null, ...letters: CodeLetter[]];

// ISO 2859-1:1999 Table 1. Columns: lot size from, to, then S-1, S-2, S-3, S-4, I, II, III.
const table1Rows: readonly Table1Row[] = [
  [2, 8, "A", "A", "A", "A", "A", "A", "B"],
  [9, 15, "A", "A", "A", "A", "A", "B", "C"],
  [16, 25, "A", "A", "B", "B", "B", "C", "D"],
  [26, 50, "A", "B", "B", "C", "C", "D", "E"],
  [51, 90, "B", "B", "C", "C", "C", "E", "F"],
  [91, 150, "B", "B", "C", "D", "D", "F", "G"],
  [151, 280, "B", "C", "D", "E", "E", "G", "H"],
  [281, 500, "B", "C", "D", "E", "F", "H", "J"],
  [501, 1200, "C", "C", "E", "F", "G", "J", "K"],
  [1201, 3200, "C", "D", "E", "G", "H", "K", "L"],
  [3201, 10000, "C", "D", "F", "G", "J", "L", "M"],
  [10001, 35000, "C", "D", "F", "H", "K", "M", "N"],
  [35001, 150000, "D", "E", "G", "J", "L", "N", "P"],
  [150001, 500000, "D", "E", "G", "J", "M", "P", "Q"],
  [500001, null, "D", "E", "H", "K", "N", "Q", "R"],
];

export const table1LotSizeRanges: readonly LotSizeRange[] = table1Rows.map(([from, to, ...letters]) => ({
  from,
  to,
  codeLetters: Object.fromEntries(inspectionLevels.map((level, k) => [level, letters[k] as CodeLetter])) as Record<
    InspectionLevel,
    CodeLetter
  >,
}));

/** Sample size n of each code letter (ISO 2859-1:1999 Table 2-A, the "sample size" column). */
export const table2aSampleSizes: Readonly<Record<CodeLetter, number>> = {
  A: 2,
  B: 3,
  C: 5,
  D: 8,
  E: 13,
  F: 20,
  G: 32,
  H: 50,
  J: 80,
  K: 125,
  L: 200,
  M: 315,
  N: 500,
  P: 800,
  Q: 1250,
  R: 2000,
};

export interface AqlColumn {
  /** In percent nonconforming (0.65 = 0.65 %). */
  value: number;
  /** As the table heads the column: "0.010", "0.65", "1.0", "10". */
  label: string;
}

/** The AQL columns offered, in the table's order. */
export const offeredAqlColumns: readonly AqlColumn[] = [
  "0.010",
  "0.015",
  "0.025",
  "0.040",
  "0.065",
  "0.10",
  "0.15",
  "0.25",
  "0.40",
  "0.65",
  "1.0",
  "1.5",
  "2.5",
  "4.0",
  "6.5",
  "10",
].map((label) => ({ value: Number(label), label }));

/** Columns of the standard's Table 2-A that Cellwright does not offer (see the note at the top). */
export const standardAqlsNotOffered: readonly number[] = [15, 25, 40, 65, 100, 150, 250, 400, 650, 1000];

/** One cell of Table 2-A: a plan [Ac, Re], or an arrow to the first plan below or above in the same column. */
export type Table2aCell = readonly [acceptanceNumber: number, rejectionNumber: number] | "down" | "up";

const DOWN = "down";
const UP = "up";

/** ISO 2859-1:1999 Table 2-A (normal inspection, single sampling), the columns 0.010 to 10: one cell per offered AQL column. */
export const table2aNormal: Readonly<Record<CodeLetter, readonly Table2aCell[]>> = {
  //  0.010     0.015     0.025     0.040     0.065     0.10      0.15      0.25      0.40      0.65      1.0       1.5       2.5       4.0       6.5       10
  A: [DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     [0, 1],   DOWN],
  B: [DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     [0, 1],   UP,       DOWN],
  C: [DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     [0, 1],   UP,       DOWN,     [1, 2]],
  D: [DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     [0, 1],   UP,       DOWN,     [1, 2],   [2, 3]],
  E: [DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     [0, 1],   UP,       DOWN,     [1, 2],   [2, 3],   [3, 4]],
  F: [DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     [0, 1],   UP,       DOWN,     [1, 2],   [2, 3],   [3, 4],   [5, 6]],
  G: [DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     [0, 1],   UP,       DOWN,     [1, 2],   [2, 3],   [3, 4],   [5, 6],   [7, 8]],
  H: [DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     [0, 1],   UP,       DOWN,     [1, 2],   [2, 3],   [3, 4],   [5, 6],   [7, 8],   [10, 11]],
  J: [DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     [0, 1],   UP,       DOWN,     [1, 2],   [2, 3],   [3, 4],   [5, 6],   [7, 8],   [10, 11], [14, 15]],
  K: [DOWN,     DOWN,     DOWN,     DOWN,     DOWN,     [0, 1],   UP,       DOWN,     [1, 2],   [2, 3],   [3, 4],   [5, 6],   [7, 8],   [10, 11], [14, 15], [21, 22]],
  L: [DOWN,     DOWN,     DOWN,     DOWN,     [0, 1],   UP,       DOWN,     [1, 2],   [2, 3],   [3, 4],   [5, 6],   [7, 8],   [10, 11], [14, 15], [21, 22], UP],
  M: [DOWN,     DOWN,     DOWN,     [0, 1],   UP,       DOWN,     [1, 2],   [2, 3],   [3, 4],   [5, 6],   [7, 8],   [10, 11], [14, 15], [21, 22], UP,       UP],
  N: [DOWN,     DOWN,     [0, 1],   UP,       DOWN,     [1, 2],   [2, 3],   [3, 4],   [5, 6],   [7, 8],   [10, 11], [14, 15], [21, 22], UP,       UP,       UP],
  P: [DOWN,     [0, 1],   UP,       DOWN,     [1, 2],   [2, 3],   [3, 4],   [5, 6],   [7, 8],   [10, 11], [14, 15], [21, 22], UP,       UP,       UP,       UP],
  Q: [[0, 1],   UP,       DOWN,     [1, 2],   [2, 3],   [3, 4],   [5, 6],   [7, 8],   [10, 11], [14, 15], [21, 22], UP,       UP,       UP,       UP,       UP],
  R: [UP,       UP,       [1, 2],   [2, 3],   [3, 4],   [5, 6],   [7, 8],   [10, 11], [14, 15], [21, 22], UP,       UP,       UP,       UP,       UP,       UP],
};
