import { describe, expect, it } from "vitest";
import { palette } from "@/tailwind.config";

// WCAG 2.2 relative luminance and contrast ratio (success criterion 1.4.3, definitions section).
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) =>
    c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4,
  ) as [number, number, number];
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x) as [number, number];
  return (hi + 0.05) / (lo + 0.05);
}

describe("theme contrast (WCAG 2.2 AA, 4.5:1 for text)", () => {
  const texts = ["ink", "ink-soft", "copper", "copper-deep", "meets", "deviates", "unassessed"] as const;
  for (const background of ["paper", "paper-deep", "copper-wash"] as const) {
    it.each(texts)(`%s on ${background}`, (text) => {
      expect(contrast(palette[text], palette[background])).toBeGreaterThanOrEqual(4.5);
    });
  }
  it("paper text on the copper button", () => {
    expect(contrast(palette.paper, palette.copper)).toBeGreaterThanOrEqual(4.5);
  });
});
