/**
 * The benchmark's floor: the least work that can turn a CSV of plain numbers into Float64Array
 * columns, one pass over the bytes with no strings, no quotes, no exponents, no checks. Not for real
 * logs (it accepts nonsense silently); it shows how far the real parser is from the bare minimum.
 */
export interface ScanFloor {
  push(chunk: Uint8Array): void;
  finish(): { columns: Float64Array[]; rows: number };
}

export function createScanFloor({
  columnCount,
  skipLines,
  delimiter = ",",
}: {
  columnCount: number;
  /** Lines before the data (the header), skipped whole. */
  skipLines: number;
  delimiter?: "," | ";" | "\t";
}): ScanFloor {
  const delimiterByte = delimiter.charCodeAt(0);
  let capacity = 1 << 16;
  let columns = Array.from({ length: columnCount }, () => new Float64Array(capacity));
  let rows = 0;
  let linesToSkip = skipLines;
  // The number being read; kept across chunks, so a chunk may end anywhere.
  let column = 0;
  let whole = 0;
  let fraction = 0;
  let scale = 1;
  let negative = false;
  let inFraction = false;
  let hasDigits = false;

  const grow = () => {
    capacity *= 2;
    columns = columns.map((old) => {
      const grown = new Float64Array(capacity);
      grown.set(old);
      return grown;
    });
  };

  function push(chunk: Uint8Array): void {
    let k = 0;
    while (linesToSkip > 0 && k < chunk.length) if (chunk[k++] === 10) linesToSkip--;
    // Locals, not closure variables, in the hot loop.
    let [c, w, f, sc, neg, frac, digits, r] = [column, whole, fraction, scale, negative, inFraction, hasDigits, rows];
    for (; k < chunk.length; k++) {
      const b = chunk[k] as number;
      if (b >= 48 && b <= 57) {
        digits = true;
        if (frac) {
          f = f * 10 + (b - 48);
          sc *= 10;
        } else {
          w = w * 10 + (b - 48);
        }
      } else if (b === 46) frac = true;
      else if (b === 45) neg = true;
      else if (b === delimiterByte || b === 10) {
        if (b === 10 && c === 0 && !digits) continue;
        if (c < columnCount) {
          const value = w + f / sc;
          (columns[c] as Float64Array)[r] = neg ? -value : value;
        }
        w = f = 0;
        sc = 1;
        neg = frac = digits = false;
        c++;
        if (b === 10) {
          c = 0;
          if (++r === capacity) grow();
        }
      }
    }
    [column, whole, fraction, scale, negative, inFraction, hasDigits, rows] = [c, w, f, sc, neg, frac, digits, r];
  }

  return {
    push,
    finish() {
      if (column > 0 || hasDigits) push(Uint8Array.of(10));
      return { columns: columns.map((c) => c.slice(0, rows)), rows };
    },
  };
}
