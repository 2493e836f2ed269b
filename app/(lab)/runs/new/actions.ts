"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { requireActionPermission } from "@/lib/auth/guards";
import { toActionState, type ActionState } from "@/lib/forms/action-state";
import { readLabToday } from "@/lib/instruments/lab-today";
import { startRun, startRunSchema } from "@/lib/runs/start-run";

export async function startRunAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  let runId: string;
  try {
    const user = await requireActionPermission("run.operate");
    const input = startRunSchema.parse({
      procedureVersionId: form.get("procedureVersionId"),
      specimenId: form.get("specimenId"),
      instrumentIds: form.getAll("instrumentIds"),
    });
    ({ id: runId } = await startRun(user, input, readLabToday()));
  } catch (error) {
    return toActionState(error);
  }
  revalidatePath("/runs");
  redirect(`/runs/${runId}`);
}
