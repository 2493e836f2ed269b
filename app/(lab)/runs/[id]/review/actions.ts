"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { requireActionPermission } from "@/lib/auth/guards";
import { issueRunCertificate } from "@/lib/certificates/issue-certificate";
import { toActionState, type ActionState } from "@/lib/forms/action-state";
import { acceptRun } from "@/lib/reviews/accept-run";
import { returnRun } from "@/lib/reviews/return-run";

const runIdSchema = z.uuid();

function revalidateRun(runId: string) {
  revalidatePath(`/runs/${runId}`, "layout");
  revalidatePath("/runs");
  revalidatePath("/");
}

export async function returnRunAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const user = await requireActionPermission("run.review");
    const runId = runIdSchema.parse(form.get("runId"));
    const { operatorName } = await returnRun(user, runId, { comments: String(form.get("comments") ?? "") });
    revalidateRun(runId);
    return { ok: true, message: `Returned to ${operatorName} with your comments; they have been told by e-mail.` };
  } catch (error) {
    return toActionState(error);
  }
}

/** The notes arrive as pairs of fields in the order of the deviating findings: findingId, note. */
export async function acceptRunAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const user = await requireActionPermission("run.review");
    const runId = runIdSchema.parse(form.get("runId"));
    const findingIds = form.getAll("findingId").map(String);
    const notes = form.getAll("note").map(String);
    const evaluationId = String(form.get("evaluationId") ?? "") || undefined;
    const { runNumber, signature } = await acceptRun(user, runId, {
      password: String(form.get("password") ?? ""),
      acknowledgements: findingIds.map((findingId, i) => ({ findingId, note: notes[i] ?? "" })),
      evaluationId,
    });
    revalidateRun(runId);
    return { ok: true, message: `Run ${runNumber} accepted and signed by ${signature.printedName}.` };
  } catch (error) {
    const state = toActionState(error);
    return state.fieldErrors ? { ...state, message: `${state.message} Nothing was signed.` } : state;
  }
}

export async function issueCertificateAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const user = await requireActionPermission("certificate.sign");
    const runId = runIdSchema.parse(form.get("runId"));
    const { number } = await issueRunCertificate(user, runId, { password: String(form.get("password") ?? "") });
    revalidateRun(runId);
    revalidatePath("/certificates");
    return { ok: true, message: `Certificate ${number} issued.` };
  } catch (error) {
    const state = toActionState(error);
    return state.fieldErrors ? { ...state, message: `${state.message} Nothing was signed.` } : state;
  }
}
