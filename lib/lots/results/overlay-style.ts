/**
 * How the k-th curve of an overlay is drawn: six colours and four dash patterns, so every one of the
 * twelve curves differs in pattern as well as colour (never colour alone).
 */
const COLOURS = ["#1f4e8c", "#9b4a1b", "#2d6a3e", "#6b3fa0", "#a02a1e", "#1d2126"] as const;
const DASHES: readonly number[][] = [[], [9, 4], [2, 3], [10, 3, 2, 3]];
const DASH_WORDS = ["solid", "dashed", "dotted", "dash-dot"] as const;

export interface OverlayStyle {
  colour: string;
  dash: number[];
  /** The pattern in words, for the legend. */
  pattern: string;
}

export function pickOverlayStyle(k: number): OverlayStyle {
  const d = k % DASHES.length;
  return { colour: COLOURS[k % COLOURS.length] as string, dash: DASHES[d] as number[], pattern: DASH_WORDS[d] as string };
}
