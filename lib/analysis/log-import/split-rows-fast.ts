import { initParser, type Schema } from "udsv";

/**
 * Splits a block of whole lines (ending with a line break, no quotes) into rows with udsv, handing
 * each row to `take`, which returns false to refuse it. Returns true only when the rows account for
 * every line: as many rows as line breaks (no blank line skipped, no row spilling into the next) and
 * every character in a cell, a delimiter or a line break. On false the caller must forget the rows
 * taken from this block and read it line by line to find what is wrong.
 */
export type FastRowSplitter = (block: string, lineCount: number, take: (row: string[]) => boolean) => boolean;

export function createFastRowSplitter({ header, delimiter }: { header: readonly string[]; delimiter: string }): FastRowSplitter {
  const schema: Schema & { skip: number } = {
    // udsv reads `skip` (header rows to drop) from the schema, though its type does not list it.
    skip: 0,
    col: delimiter,
    row: "\n",
    encl: "",
    esc: "",
    trim: false,
    cols: header.map((name) => ({ name, type: "s", repl: { empty: null, null: undefined, NaN: undefined } })),
  };
  const parser = initParser(schema);
  const cellCount = header.length;
  const lastCell = cellCount - 1;

  return (block, lineCount, take) => {
    let rowCount = 0;
    let chars = 0;
    let accounted = true;
    parser.stringArrs(block, (row: string[]) => {
      // udsv puts a too-long row's extra cells into its last cell, and can loop on a short last row.
      if (rowCount === lineCount || (row[lastCell] as string).indexOf(delimiter) !== -1 || !take(row)) {
        accounted = false;
        return false;
      }
      for (let k = 0; k < cellCount; k++) chars += (row[k] as string).length;
      rowCount++;
      return true;
    });
    return accounted && rowCount === lineCount && chars + rowCount * cellCount === block.length;
  };
}
