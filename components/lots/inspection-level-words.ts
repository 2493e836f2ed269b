import type { InspectionLevel } from "@/lib/lots/sampling";

/**
 * ISO 2859-1 inspection levels in the lab's words: the general levels for ordinary lots, the special
 * levels where the test is destructive or costly and small samples are needed (common practice).
 */
export const INSPECTION_LEVEL_WORDS: Readonly<Record<InspectionLevel, string>> = {
  I: "General I (smaller sample, less discrimination)",
  II: "General II (the usual level)",
  III: "General III (larger sample, more discrimination)",
  "S-1": "Special S-1 (smallest samples, destructive tests)",
  "S-2": "Special S-2 (small samples, destructive tests)",
  "S-3": "Special S-3 (small samples)",
  "S-4": "Special S-4 (small samples, the largest special level)",
};

/** In the order a person picks them: the general levels first, the usual one in the middle. */
export const INSPECTION_LEVEL_ORDER: readonly InspectionLevel[] = ["I", "II", "III", "S-1", "S-2", "S-3", "S-4"];
