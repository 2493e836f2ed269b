"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { listSchemaProblems } from "@/components/procedure-editor/schema-problems";
import { getDb } from "@/db";
import { getProcedureVersion } from "@/db/procedures";
import { DomainError } from "@/lib/errors";
import type { ActionState } from "@/lib/forms/action-state";
import { serverAction } from "@/lib/forms/server-action";
import { saveDraft } from "@/lib/procedures/lifecycle";
import { procedureDraftSchema } from "@/lib/procedures/procedure-input";

const versionRefSchema = z.object({
  procedureId: z.uuid("Not a procedure id."),
  number: z.number().int().min(1),
  draft: z.unknown(),
});

/** The same field paths and messages as the editor's own check (union problems narrowed to the form used). */
function refuse(error: z.ZodError): ActionState {
  const fieldErrors: Record<string, string[]> = {};
  for (const { path, message } of listSchemaProblems(error.issues)) (fieldErrors[path || "form"] ??= []).push(message);
  return { ok: false, message: "The draft was not saved: some fields need attention.", fieldErrors };
}

/**
 * Saves the whole draft of one version. The editor sends the draft as an object (not FormData);
 * it is checked with procedureDraftSchema, so refusals come back keyed by the zod path
 * ("definition.steps.2.current.value") and the editor shows each beside its field. The save is one
 * transaction: either all of it is stored or nothing.
 */
export const saveDraftAction = serverAction.withArgument(
  { access: "/procedures/[id]/versions/[n]/edit", input: versionRefSchema },
  async ({ user: actor, input: { procedureId, number, draft } }): Promise<ActionState> => {
    const checked = procedureDraftSchema.safeParse(draft);
    if (!checked.success) return refuse(checked.error);
    const input = checked.data;
    const version = await getProcedureVersion(getDb(), procedureId, number);
    if (!version) throw new DomainError("not-found", "No such procedure version.");
    await saveDraft(actor, version.id, input);
    revalidatePath(`/procedures/${procedureId}`);
    revalidatePath(`/procedures/${procedureId}/versions/${number}`);
    revalidatePath(`/procedures/${procedureId}/versions/${number}/edit`);
    return { ok: true, message: `Version ${number} saved as a draft.` };
  },
);
