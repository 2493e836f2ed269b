import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { formatDuration, formatFigure, formatMah, formatMilliohm, formatMoment, formatVolts, formatWh } from "@/lib/certificates/certificate-format";
import { isSetInCertificateFont, toCertificateText } from "@/lib/certificates/certificate-text";

const plain = (s: string) => s.replace(/\u00a0/g, " ");

describe("certificate figures", () => {
  it("writes values with their units and fixed decimals, as docs/design.md §9 shows them", () => {
    expect(plain(formatMah(3061.2))).toBe("3 061 mAh");
    expect(plain(formatWh(11.0249))).toBe("11.02 Wh");
    expect(plain(formatVolts(3.6))).toBe("3.60 V");
    expect(plain(formatMilliohm(0.02))).toBe("20.0 mΩ");
    expect(plain(formatFigure(-0.5, 1))).toBe("\u22120.5");
    expect(plain(formatFigure(-0.04, 1))).toBe("0.0");
    expect(plain(formatDuration(18_360))).toBe("5 h 06 min");
    expect(plain(formatDuration(42))).toBe("42 s");
    expect(formatMoment("2026-03-04T09:30:12.345Z")).toBe("2026-03-04T09:30Z");
    // ISO 8601 with its zone throughout (issue 12, 7e): another offset is converted to UTC.
    expect(formatMoment("2026-03-04T10:30:00+01:00")).toBe("2026-03-04T09:30Z");
  });

  it("never lets a value break from its unit or inside its digit groups", () => {
    fc.assert(
      fc.property(fc.double({ min: -1e9, max: 1e9, noNaN: true }), (x) => {
        expect(formatMah(x)).not.toContain(" ");
      }),
    );
  });
});

describe("toCertificateText", () => {
  it("writes out the symbols the certificate font cannot set", () => {
    expect(toCertificateText("R ≤ 20 mΩ; Q = ∫|I| dt ≥ 3.0 Ah")).toBe("R <= 20 milliohm; Q = integral of |I| dt >= 3.0 Ah");
    expect(toCertificateText("u = a/√3 at 23 ℃")).toBe("u = a/sqrt3 at 23 °C");
    expect(toCertificateText("R = 1.5 Ω ☃")).toBe("R = 1.5 ohm ?");
  });

  it("keeps Latin letters, the minus sign, degrees and plus-minus", () => {
    const text = "Prüflabor Łódź: −0.5 °C ± 0.1 — 5 µm × 2 “ok” …";
    expect(toCertificateText(text)).toBe(text);
  });

  it("returns only characters the font draws", () => {
    fc.assert(
      fc.property(fc.string({ unit: "binary" }), (s) => {
        for (const char of toCertificateText(s)) expect(isSetInCertificateFont(char.codePointAt(0) as number)).toBe(true);
      }),
    );
  });
});
