import clsx from "clsx";
import type { ProcedureStatus } from "@/db/schema";

const STYLE: Record<ProcedureStatus, { words: string; mark: string; className: string }> = {
  draft: { words: "draft", mark: "✎", className: "border-rule text-ink-soft" },
  in_review: { words: "in review", mark: "◔", className: "border-copper text-copper-deep" },
  released: { words: "released", mark: "✓", className: "border-meets text-meets" },
  withdrawn: { words: "withdrawn", mark: "⊘", className: "border-unassessed text-unassessed" },
};

/** A version's status in words, with a mark and colour as support only. */
export function StatusBadge({ status }: { status: ProcedureStatus }) {
  const s = STYLE[status];
  return (
    <span className={clsx("inline-flex items-center gap-1 rounded border px-1.5 py-0.5 text-xs font-medium", s.className)}>
      <span aria-hidden="true">{s.mark}</span>
      {s.words}
    </span>
  );
}
