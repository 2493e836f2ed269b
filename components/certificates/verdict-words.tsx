import clsx from "clsx";

const TONES: Record<string, { tone: string; mark: string }> = {
  conforms: { tone: "text-meets", mark: "✓" },
  "does not conform": { tone: "text-deviates", mark: "✕" },
  "conditional pass": { tone: "text-unassessed", mark: "✓?" },
  "conditional fail": { tone: "text-deviates", mark: "✕?" },
  "not decided": { tone: "text-unassessed", mark: "?" },
  "lot accepted": { tone: "text-meets", mark: "✓" },
  "lot rejected": { tone: "text-deviates", mark: "✕" },
};

/** A statement of conformity in words first (conforms / does not conform / not decided). */
export function VerdictWords({ verdict }: { verdict: string }) {
  const t = TONES[verdict] ?? { tone: "text-ink", mark: "" };
  return (
    <span className={clsx("font-medium", t.tone)}>
      {t.mark && <span aria-hidden="true">{t.mark} </span>}
      {verdict}
    </span>
  );
}
