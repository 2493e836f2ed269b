"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { issueRunCertificate } from "@/lib/certificates/issue-certificate";
import type { ActionState } from "@/lib/forms/action-state";
import { serverAction } from "@/lib/forms/server-action";
import { acceptRun } from "@/lib/reviews/accept-run";
import { returnRun } from "@/lib/reviews/return-run";

const runIdSchema = z.uuid();

function revalidateRun(runId: string) {
  revalidatePath(`/runs/${runId}`, "layout");
  revalidatePath("/runs");
  revalidatePath("/");
}

const nothingSigned = (state: ActionState): ActionState => (state.fieldErrors ? { ...state, message: `${state.message} Nothing was signed.` } : state);

export const returnRunAction = serverAction({ access: "run.review" }, async ({ user, form }) => {
  const runId = runIdSchema.parse(form.get("runId"));
  const { operatorName } = await returnRun(user, runId, { comments: String(form.get("comments") ?? "") });
  revalidateRun(runId);
  return { ok: true, message: `Returned to ${operatorName} with your comments; they have been told by e-mail.` };
});

/** The notes arrive as pairs of fields in the order of the deviating findings: findingId, note. */
export const acceptRunAction = serverAction({ access: "run.review", refused: nothingSigned }, async ({ user, form }) => {
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
});

export const issueCertificateAction = serverAction({ access: "certificate.sign", refused: nothingSigned }, async ({ user, form }) => {
  const runId = runIdSchema.parse(form.get("runId"));
  const { number } = await issueRunCertificate(user, runId, { password: String(form.get("password") ?? "") });
  revalidateRun(runId);
  revalidatePath("/certificates");
  return { ok: true, message: `Certificate ${number} issued.` };
});
