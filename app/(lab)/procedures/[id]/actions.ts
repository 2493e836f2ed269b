"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { getDb } from "@/db";
import { getProcedureVersionById } from "@/db/procedures";
import { requireActionPermission } from "@/lib/auth/guards";
import { toActionState, type ActionState } from "@/lib/forms/action-state";
import { reasonSchema } from "@/lib/procedures/procedure-input";
import { signAndReleaseVersion, returnToDraft, startNewDraft, submitForReview, withdrawVersion } from "@/lib/procedures/lifecycle";

const versionIdSchema = z.object({ versionId: z.uuid() });

async function procedurePathOf(versionId: string): Promise<string> {
  const v = await getProcedureVersionById(getDb(), versionId);
  return v ? `/procedures/${v.procedureId}` : "/procedures";
}

export async function submitForReviewAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const user = await requireActionPermission("procedure.author");
    const { versionId } = versionIdSchema.parse(Object.fromEntries(form));
    await submitForReview(user, versionId);
    revalidatePath(await procedurePathOf(versionId), "layout");
    return { ok: true, message: "Submitted for review. Another engineer can now release it." };
  } catch (error) {
    return toActionState(error);
  }
}

export async function returnToDraftAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const user = await requireActionPermission("procedure.author");
    const { versionId, comment } = versionIdSchema.extend({ comment: reasonSchema }).parse(Object.fromEntries(form));
    await returnToDraft(user, versionId, comment);
    revalidatePath(await procedurePathOf(versionId), "layout");
    return { ok: true, message: "Returned to draft with your comment." };
  } catch (error) {
    return toActionState(error);
  }
}

export async function releaseAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const user = await requireActionPermission("procedure.release");
    const { versionId, password } = versionIdSchema.extend({ password: z.string().min(1, { error: "enter your password to sign" }).max(1000) }).parse(Object.fromEntries(form));
    await signAndReleaseVersion(user, versionId, password);
    revalidatePath(await procedurePathOf(versionId), "layout");
    return { ok: true, message: "Released with your signature (approved for use). Operators can now run this version; it can no longer change." };
  } catch (error) {
    return toActionState(error);
  }
}

export async function withdrawAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const user = await requireActionPermission("procedure.release");
    const { versionId, reason } = versionIdSchema.extend({ reason: reasonSchema }).parse(Object.fromEntries(form));
    await withdrawVersion(user, versionId, reason);
    revalidatePath(await procedurePathOf(versionId), "layout");
    return { ok: true, message: "Withdrawn. No new runs can start on it." };
  } catch (error) {
    return toActionState(error);
  }
}

export async function startNewDraftAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  let target: string;
  try {
    const user = await requireActionPermission("procedure.author");
    const { versionId } = versionIdSchema.parse(Object.fromEntries(form));
    const { number } = await startNewDraft(user, versionId);
    target = `${await procedurePathOf(versionId)}/versions/${number}/edit`;
  } catch (error) {
    return toActionState(error);
  }
  redirect(target);
}
