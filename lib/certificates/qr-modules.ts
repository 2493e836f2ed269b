import QRCode from "qrcode";

/** One horizontal run of dark modules: row, first column, length, in module units. */
export interface QrRun {
  row: number;
  column: number;
  length: number;
}

export interface QrModules {
  /** Modules per side, without the quiet zone. */
  size: number;
  runs: QrRun[];
}

/**
 * The dark modules of a QR code for `text` (error correction M), merged into horizontal runs so
 * the certificate draws one rectangle per run as vector graphics rather than a picture.
 */
export function createQrModules(text: string): QrModules {
  const { modules } = QRCode.create(text, { errorCorrectionLevel: "M" });
  const { size, data } = modules;
  const runs: QrRun[] = [];
  for (let row = 0; row < size; row++) {
    let start = -1;
    for (let column = 0; column <= size; column++) {
      const dark = column < size && data[row * size + column] === 1;
      if (dark && start < 0) start = column;
      if (!dark && start >= 0) {
        runs.push({ row, column: start, length: column - start });
        start = -1;
      }
    }
  }
  return { size, runs };
}
