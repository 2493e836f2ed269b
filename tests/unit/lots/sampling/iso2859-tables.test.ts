import { describe, expect, it } from "vitest";
import {
  codeLetters,
  inspectionLevels,
  offeredAqlColumns,
  resolveTable2aCell,
  table1LotSizeRanges,
  table2aNormal,
  table2aSampleSizes,
  type Table2aCell,
} from "@/lib/lots/sampling";

// Consistency checks of the recalled tables: they catch a typing slip in the data, not a wrong memory.
describe("Table 1 as data", () => {
  it("covers every lot size from 2 up without gaps or overlaps", () => {
    expect(table1LotSizeRanges[0]?.from).toBe(2);
    for (let k = 1; k < table1LotSizeRanges.length; k++) {
      expect(table1LotSizeRanges[k]?.from).toBe((table1LotSizeRanges[k - 1]?.to as number) + 1);
    }
    expect(table1LotSizeRanges.at(-1)?.to).toBeNull();
  });

  it("never gives a smaller code letter for a larger lot or a higher inspection level", () => {
    const rank = (letter: string) => codeLetters.indexOf(letter as (typeof codeLetters)[number]);
    table1LotSizeRanges.forEach((range, k) => {
      const ranks = inspectionLevels.map((level) => rank(range.codeLetters[level]));
      expect([...ranks].sort((a, b) => a - b)).toEqual(ranks);
      const previous = table1LotSizeRanges[k - 1];
      if (previous) for (const level of inspectionLevels) expect(rank(range.codeLetters[level])).toBeGreaterThanOrEqual(rank(previous.codeLetters[level]));
    });
  });
});

describe("Table 2-A as data", () => {
  it("has one cell per offered AQL in every row, sample sizes rising, and Re = Ac + 1 in every plan", () => {
    const sizes = codeLetters.map((letter) => table2aSampleSizes[letter]);
    expect([...sizes].sort((a, b) => a - b)).toEqual(sizes);
    for (const letter of codeLetters) {
      expect(table2aNormal[letter]).toHaveLength(offeredAqlColumns.length);
      for (const cell of table2aNormal[letter]) if (typeof cell !== "string") expect(cell[1]).toBe(cell[0] + 1);
    }
  });

  // The table's pattern: a cell depends only on d = row + column (both counted from 0 at A and 0.010),
  // except at the two edges where an arrow would leave the table (A at 10, R at 0.015).
  const plansAlongDiagonal: Table2aCell[] = [[1, 2], [2, 3], [3, 4], [5, 6], [7, 8], [10, 11], [14, 15], [21, 22]];
  function expectedCell(d: number): Table2aCell {
    if (d <= 13) return "down";
    if (d === 14) return [0, 1];
    if (d === 15) return "up";
    if (d === 16) return "down";
    return plansAlongDiagonal[d - 17] ?? "up";
  }

  it("keeps its diagonal pattern, with only the two documented edge cells differing", () => {
    const exceptions: string[] = [];
    codeLetters.forEach((letter, row) =>
      table2aNormal[letter].forEach((cell, column) => {
        if (JSON.stringify(cell) !== JSON.stringify(expectedCell(row + column))) exceptions.push(`${letter} ${offeredAqlColumns[column]?.label}`);
      }),
    );
    expect(exceptions.sort()).toEqual(["A 10", "R 0.015"]);
    expect(table2aNormal.A[15]).toBe("down");
    expect(table2aNormal.R[1]).toBe("up");
  });

  it("leads from every cell to a plan, following arrows one way, with n never falling as the letter rises", () => {
    offeredAqlColumns.forEach((_column, columnIndex) => {
      let previousSize = 0;
      for (const letter of codeLetters) {
        const resolved = resolveTable2aCell(letter, columnIndex);
        const size = table2aSampleSizes[resolved.codeLetter];
        expect(size).toBeGreaterThanOrEqual(previousSize);
        previousSize = size;
      }
    });
  });
});
