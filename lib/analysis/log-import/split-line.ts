const quote = '"';

/**
 * Splits one line (without its line ending) into cells at the delimiter, after RFC 4180: a cell
 * that starts with a double quote runs to the matching quote, and "" inside it is one quote.
 * Returns null when a quote opened on the line is never closed (a log has no line breaks in cells).
 * Used for header and metadata lines, for the preview, and to find the exact place of a bad line.
 */
export function splitLine(line: string, delimiter: string): string[] | null {
  const cells: string[] = [];
  let pos = 0;
  for (;;) {
    if (line.charAt(pos) === quote) {
      let cell = "";
      let from = pos + 1;
      for (;;) {
        const close = line.indexOf(quote, from);
        if (close === -1) return null;
        cell += line.slice(from, close);
        if (line.charAt(close + 1) === quote) {
          cell += quote;
          from = close + 2;
          continue;
        }
        pos = close + 1;
        break;
      }
      // Text between a closing quote and the delimiter is kept as written.
      const end = findDelimiter(line, delimiter, pos);
      cells.push(cell + line.slice(pos, end));
      if (end === line.length) return cells;
      pos = end + delimiter.length;
    } else {
      const end = findDelimiter(line, delimiter, pos);
      cells.push(line.slice(pos, end));
      if (end === line.length) return cells;
      pos = end + delimiter.length;
    }
  }
}

function findDelimiter(line: string, delimiter: string, from: number): number {
  const at = line.indexOf(delimiter, from);
  return at === -1 ? line.length : at;
}

/** Header text as a person reads it: quotes already removed by the splitter, outer spaces trimmed. */
export function normaliseHeaderCell(cell: string): string {
  return cell.trim();
}
