/**
 * Text as the certificate's font can set it. Merriweather ships Latin and Latin Extended glyphs
 * only (no Greek, no mathematical operators), so symbols the conformance texts use are written out
 * in plain words or ASCII before they reach the PDF; a character still outside the font becomes "?"
 * rather than an empty box.
 */
const REPLACEMENTS: [RegExp, string][] = [
  [/mΩ/g, "milliohm"],
  [/[ΩΩ]/g, "ohm"],
  [/≥/g, ">="],
  [/≤/g, "<="],
  [/≈/g, "~"],
  [/→/g, "->"],
  [/∫/g, "integral of "],
  [/√/g, "sqrt"],
  [/Σ/g, "sum of "],
  [/∏/g, "product of "],
  [/Δ/g, "delta "],
  [/∂/g, "d"],
  [/ᵢ/g, "i"],
  [/₀/g, "0"],
  [/₁/g, "1"],
  [/₂/g, "2"],
  [/℃/g, "°C"],
  [/⌊/g, "floor("],
  [/⌋/g, ")"],
  [/[✓✔]/g, "yes"],
  [/[✕✗]/g, "no"],
  [/\u202f/g, "\u00a0"],
  [/\u2011/g, "-"],
];

/** Code points beyond Latin-1 that the Latin subset of the font draws (checked against the font files in tests). */
const EXTRA_LATIN = new Set([
  0x131, 0x152, 0x153, 0x2bb, 0x2bc, 0x2c6, 0x2da, 0x2dc, 0x2009, 0x2013, 0x2014, 0x2018, 0x2019, 0x201a, 0x201c, 0x201d, 0x201e, 0x2022,
  0x2026, 0x2032, 0x2033, 0x2039, 0x203a, 0x2044, 0x20ac, 0x2122, 0x2191, 0x2193, 0x2212, 0x2215,
]);

/** Rare Latin Extended letters (and the soft hyphen) the two subsets leave out. */
const MISSING = new Set([
  0xad, 0x149, 0x184, 0x185, 0x18d, 0x195, 0x1a2, 0x1a3, 0x1a7, 0x1a8, 0x1aa, 0x1ab, 0x1ba, 0x1bb, 0x1bc, 0x1bd, 0x1be, 0x1bf, 0x1f6, 0x1f7,
  0x221, 0x224, 0x225, 0x234, 0x235, 0x236, 0x238, 0x239, 0x23f, 0x240,
]);

/** True when Merriweather (Latin + Latin Extended subsets as registered) has a glyph for the code point. */
export function isSetInCertificateFont(codePoint: number): boolean {
  if (codePoint === 0x0a || (codePoint >= 0x20 && codePoint <= 0x7e)) return true;
  if (codePoint >= 0xa0 && codePoint <= 0x24f) return !MISSING.has(codePoint);
  return EXTRA_LATIN.has(codePoint);
}

export function toCertificateText(text: string): string {
  let out = text;
  for (const [pattern, replacement] of REPLACEMENTS) out = out.replace(pattern, replacement);
  // Words that ran into a replaced symbol ("20 milliohm", "0.2 ohm") keep one space only.
  out = out.replace(/ {2,}/g, " ");
  let safe = "";
  for (const char of out) safe += isSetInCertificateFont(char.codePointAt(0) as number) ? char : "?";
  return safe;
}
