"use server";

import { z } from "zod";
import { requireActionPermission } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";
import { toActionState } from "@/lib/forms/action-state";
import type { FindingLine } from "@/lib/runs/group-findings";
import { readEvaluationView } from "@/lib/runs/read-evaluation-view";

const askSchema = z.object({ runId: z.uuid(), evaluationId: z.uuid(), groupKey: z.string().min(1).max(300) });

/** The findings of one step of a stored evaluation, for a group opened on the results page. */
export async function loadFindingGroupAction(runId: string, evaluationId: string, groupKey: string): Promise<{ lines: FindingLine[] } | { message: string }> {
  try {
    await requireActionPermission("run.read");
    const ask = askSchema.safeParse({ runId, evaluationId, groupKey });
    const view = ask.success ? await readEvaluationView(ask.data.evaluationId) : null;
    const group = ask.success && view?.runId === ask.data.runId ? view.groups.find((g) => g.key === ask.data.groupKey) : undefined;
    if (!group) throw new DomainError("not-found", "These findings are no longer there: reload the page.");
    return { lines: group.findings };
  } catch (error) {
    return { message: toActionState(error).message ?? "The findings could not be loaded." };
  }
}
