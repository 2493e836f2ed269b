"use server";

import { z } from "zod";
import { DomainError } from "@/lib/errors";
import { serverAction } from "@/lib/forms/server-action";
import { readEvaluationView } from "@/lib/runs/read-evaluation-view";

const askSchema = z.object({ runId: z.uuid(), evaluationId: z.uuid(), groupKey: z.string().min(1).max(300) });

/** The findings of one step of a stored evaluation, for a group opened on the results page. */
export const loadFindingGroupAction = serverAction.read({ access: "/runs/[id]/results", input: askSchema }, async ({ input }) => {
  const view = await readEvaluationView(input.evaluationId);
  const group = view?.runId === input.runId ? view.groups.find((g) => g.key === input.groupKey) : undefined;
  if (!group) throw new DomainError("not-found", "These findings are no longer there: reload the page.");
  return { lines: group.findings };
});
