import clsx from "clsx";
import type { CalibrationStatus } from "@/lib/instruments/calibration-status";

const STYLE: Record<CalibrationStatus, { mark: string; className: string }> = {
  valid: { mark: "✓", className: "border-meets text-meets" },
  "due soon": { mark: "◔", className: "border-copper text-copper-deep" },
  overdue: { mark: "✕", className: "border-deviates text-deviates" },
};

/** A calibration's standing in words, with a mark and colour as support only. */
export function CalibrationBadge({ status }: { status: CalibrationStatus }) {
  const s = STYLE[status];
  return (
    <span className={clsx("inline-flex items-center gap-1 whitespace-nowrap rounded border px-1.5 py-0.5 text-xs font-medium", s.className)}>
      <span aria-hidden="true">{s.mark}</span>
      {status}
    </span>
  );
}

/** An instrument taken out of use, in the same words-first manner. */
export function OutOfUseBadge() {
  return (
    <span className="inline-flex items-center gap-1 whitespace-nowrap rounded border border-unassessed px-1.5 py-0.5 text-xs font-medium text-unassessed">
      <span aria-hidden="true">⊘</span>
      out of use
    </span>
  );
}
