import { readFileSync } from "node:fs";
import { join } from "node:path";
import QRCode from "qrcode";
import { describe, expect, it } from "vitest";
import { isSetInCertificateFont } from "@/lib/certificates/certificate-text";
import { createQrModules } from "@/lib/certificates/qr-modules";
import { chooseTickStep, layOutVqPlot } from "@/lib/certificates/vq-plot";
import { convertWoffToSfnt } from "@/lib/certificates/woff-to-sfnt";

interface FontReader {
  create(bytes: Buffer): { numGlyphs: number; hasGlyphForCodePoint(codePoint: number): boolean; characterSet: number[] };
}
// fontkit is the font reader @react-pdf/renderer itself uses (a dependency of it, so no types of its own here).
const fontkitModule = "fontkit";
const fontkit = (await import(/* @vite-ignore */ fontkitModule)) as FontReader;
const FONT_DIR = join(process.cwd(), "node_modules", "@fontsource", "merriweather", "files");
const open = (bytes: Buffer) => fontkit.create(bytes);

describe("the QR code's vector modules", () => {
  it("cover exactly the dark modules of the QR code, each once", () => {
    const text = "http://localhost:3000/check/C-00042";
    const { modules } = QRCode.create(text, { errorCorrectionLevel: "M" });
    const drawn = createQrModules(text);
    expect(drawn.size).toBe(modules.size);
    const covered = new Uint8Array(modules.size * modules.size);
    for (const run of drawn.runs) for (let c = run.column; c < run.column + run.length; c++) covered[run.row * modules.size + c]! += 1;
    expect(Array.from(covered)).toEqual(Array.from(modules.data));
  });
});

describe("the V–Q plot geometry", () => {
  it("chooses 1-2-5 tick steps", () => {
    expect(chooseTickStep(3300, 6)).toBe(1000);
    expect(chooseTickStep(1.7, 5)).toBe(0.5);
    expect(chooseTickStep(0.9, 5)).toBe(0.2);
  });

  it("puts the curve inside the plot area with round axis limits around it", () => {
    const layout = layOutVqPlot({ capacityMAh: [0, 1500, 3297], voltageV: [4.15, 3.65, 2.5] }, 300, 150);
    expect(layout.xMax).toBe(4000);
    expect([layout.yMin, layout.yMax]).toEqual([2.5, 4.5]);
    const points = layout.points.split(" ").map((p) => p.split(",").map(Number));
    // Points are written with two decimals.
    expect(points[0]![0]).toBe(0);
    expect(points[0]![1]).toBeCloseTo(150 - ((4.15 - 2.5) / 2) * 150, 2);
    expect(points[2]![0]).toBeCloseTo((3297 / 4000) * 300, 2);
    expect(points[2]![1]).toBe(150);
    for (const [x, y] of points) {
      expect(x).toBeGreaterThanOrEqual(0);
      expect(x).toBeLessThanOrEqual(300);
      expect(y).toBeGreaterThanOrEqual(0);
      expect(y).toBeLessThanOrEqual(150);
    }
    expect(layout.xTicks.map((t) => t.value)).toEqual([0, 1000, 2000, 3000, 4000]);
  });
});

describe("the certificate font", () => {
  it("unpacks WOFF to a font with the same glyphs", () => {
    const woff = readFileSync(join(FONT_DIR, "merriweather-latin-400-normal.woff"));
    const sfnt = convertWoffToSfnt(woff);
    expect(sfnt.readUInt32BE(0)).toBe(woff.readUInt32BE(4));
    const a = open(woff);
    const b = open(sfnt);
    expect(b.numGlyphs).toBe(a.numGlyphs);
    expect(b.characterSet).toEqual(a.characterSet);
    expect(() => convertWoffToSfnt(Buffer.from("not a font at all, just text here........................"))).toThrow(/not a WOFF/);
  });

  it("draws every character toCertificateText lets through, in each registered face", () => {
    for (const face of ["400-normal", "700-normal", "400-italic", "700-italic"]) {
      const latin = open(readFileSync(join(FONT_DIR, `merriweather-latin-${face}.woff`)));
      const ext = open(readFileSync(join(FONT_DIR, `merriweather-latin-ext-${face}.woff`)));
      for (let c = 0x20; c < 0x3000; c++) {
        if (isSetInCertificateFont(c)) expect(latin.hasGlyphForCodePoint(c) || ext.hasGlyphForCodePoint(c), `U+${c.toString(16)} in ${face}`).toBe(true);
      }
    }
  });
});
