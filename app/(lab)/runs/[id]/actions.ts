"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { correctionFormSchema, correctStepRecord, readCorrectionForm } from "@/components/runs/step-sheet/step-correction";
import { buildStepRecord, readStepForm, stampStepTime, stepFormSchema, stepKeySchema } from "@/components/runs/step-sheet/step-form";
import { getDb } from "@/db";
import { getRun, getStepRecord } from "@/db/runs";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import type { ActionState } from "@/lib/forms/action-state";
import { serverAction } from "@/lib/forms/server-action";
import { recordStep } from "@/lib/runs/record-step";
import { abandonRun } from "@/lib/runs/abandon-run";
import { submitRun } from "@/lib/runs/submit-run";

async function loadStep(runId: string, stepId: string, cycle: number) {
  const db = getDb();
  const [run, before] = await Promise.all([getRun(db, runId), getStepRecord(db, runId, stepId, cycle)]);
  if (!run) throw new DomainError("not-found", "No such run.");
  const step = run.resolution.steps.find((s) => s.id === stepId);
  if (!step) throw new DomainError("invalid", `The procedure of run ${run.number} has no step ${stepId}.`);
  const cautionCodes = run.resolution.cautions.filter((c) => c.stepId === stepId).map((c) => c.code);
  return { run, step, before, cautionCodes };
}

async function markStepTime(user: SignedInUser, form: FormData, which: "start" | "end"): Promise<ActionState> {
  const key = stepKeySchema.parse(Object.fromEntries(form));
  const { before, cautionCodes } = await loadStep(key.runId, key.stepId, key.cycle);
  const acknowledged = form.getAll("acknowledged").filter((v): v is string => typeof v === "string");
  // The server's clock, never the browser's: the audit trail and the checks rely on it.
  const stamped = stampStepTime({
    before,
    stepId: key.stepId,
    cycle: key.cycle,
    which,
    now: new Date().toISOString(),
    cautionCodes,
    acknowledged,
    by: user.displayName,
  });
  if (!stamped.ok) return { ok: false, message: stamped.message };
  await recordStep(user, key.runId, stamped.record);
  revalidatePath(`/runs/${key.runId}`, "layout");
  return { ok: true, message: which === "start" ? "Start marked." : "End marked." };
}

export const markStepStartAction = serverAction({ access: "run.operate" }, async ({ user, form }) => markStepTime(user, form, "start"));

export const markStepEndAction = serverAction({ access: "run.operate" }, async ({ user, form }) => markStepTime(user, form, "end"));

export const saveStepRecordAction = serverAction({ access: "run.operate", input: stepFormSchema, read: readStepForm }, async ({ user, input }) => {
  const { step, before, cautionCodes } = await loadStep(input.runId, input.stepId, input.cycle);
  const built = buildStepRecord({ step, before, form: input, cautionCodes, now: new Date().toISOString(), by: user.displayName });
  if (!built.ok) return { ok: false, message: built.message, fieldErrors: built.fieldErrors };
  await recordStep(user, input.runId, built.record);
  revalidatePath(`/runs/${input.runId}`, "layout");
  return { ok: true, message: built.record.completed ? "Step ticked." : "Saved." };
});

export const correctStepAction = serverAction({ access: "run.operate", input: correctionFormSchema, read: readCorrectionForm }, async ({ user, input }) => {
  const { step, before } = await loadStep(input.runId, input.stepId, input.cycle);
  if (!before) return { ok: false, message: "Nothing is recorded for this step yet; record it on its line." };
  const corrected = correctStepRecord({ step, before, form: input, by: user.displayName, now: new Date().toISOString() });
  if (!corrected.ok) return { ok: false, message: corrected.message, fieldErrors: corrected.fieldErrors };
  await recordStep(user, input.runId, corrected.record, { summary: corrected.summary, reason: input.reason ?? "" });
  revalidatePath(`/runs/${input.runId}`, "layout");
  return { ok: true, message: "Corrected. The old entries stay on the record, struck through." };
});

const abandonFormSchema = z.object({
  runId: z.uuid(),
  reason: z.string().trim().min(3, { error: "say why the run is abandoned" }).max(1000, { error: "at most 1 000 characters" }),
});

export const abandonRunAction = serverAction({ access: "run.operate", input: abandonFormSchema }, async ({ user, input: { runId, reason } }) => {
  await abandonRun(user, runId, reason);
  revalidatePath(`/runs/${runId}`, "layout");
  revalidatePath("/runs");
  return { ok: true, message: "The run is abandoned. Its records are kept." };
});

const submitFormSchema = z.object({ runId: z.uuid(), confirmDeviations: z.coerce.number<unknown>().int().min(0).optional() });

export const submitRunAction = serverAction({ access: "run.operate", input: submitFormSchema }, async ({ user, input: { runId, confirmDeviations } }) => {
  await submitRun(user, runId, { confirmedDeviations: confirmDeviations });
  revalidatePath(`/runs/${runId}`, "layout");
  revalidatePath("/runs");
  return { ok: true, message: "Submitted for review. The engineers have been notified." };
});
