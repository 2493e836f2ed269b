import type { RunStatus } from "@/db/schema";

/** Run states in the lab's words (docs/design.md §3), with a mark that only supports the words. */
export const RUN_STATUS_WORDS: Record<RunStatus, { words: string; mark: string }> = {
  planned: { words: "planned", mark: "○" },
  in_progress: { words: "in progress", mark: "◐" },
  submitted: { words: "submitted for review", mark: "◑" },
  returned: { words: "returned to the operator", mark: "↺" },
  accepted: { words: "accepted", mark: "✓" },
  certified: { words: "certified", mark: "✓✓" },
  abandoned: { words: "abandoned", mark: "✕" },
};

/** The operator may still record steps and upload logs. */
export function isRunOpen(status: RunStatus): boolean {
  return status === "planned" || status === "in_progress" || status === "returned";
}
