import clsx from "clsx";
import type { LotMemberResult } from "@/db/lot-sampling";

const TONES: Record<LotMemberResult, { tone: string; mark: string }> = {
  conforms: { tone: "text-meets", mark: "✓" },
  "does not conform": { tone: "text-deviates", mark: "✕" },
  "not decided": { tone: "text-unassessed", mark: "?" },
  "not tested": { tone: "text-ink-soft", mark: "·" },
};

/** A drawn cell's result in words first; the mark and colour only support them. */
export function CellResultWords({ result }: { result: LotMemberResult }) {
  const t = TONES[result];
  return (
    <span className={clsx("whitespace-nowrap font-medium", t.tone)}>
      <span aria-hidden="true">{t.mark} </span>
      {result}
    </span>
  );
}
