"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { getDb } from "@/db";
import { getProcedureVersionById } from "@/db/procedures";
import { serverAction } from "@/lib/forms/server-action";
import { reasonSchema } from "@/lib/procedures/procedure-input";
import { signAndReleaseVersion, returnToDraft, startNewDraft, submitForReview, withdrawVersion } from "@/lib/procedures/lifecycle";

const versionIdSchema = z.object({ versionId: z.uuid() });

async function procedurePathOf(versionId: string): Promise<string> {
  const v = await getProcedureVersionById(getDb(), versionId);
  return v ? `/procedures/${v.procedureId}` : "/procedures";
}

export const submitForReviewAction = serverAction({ access: "procedure.author", input: versionIdSchema }, async ({ user, input: { versionId } }) => {
  await submitForReview(user, versionId);
  revalidatePath(await procedurePathOf(versionId), "layout");
  return { ok: true, message: "Submitted for review. Another engineer can now release it." };
});

export const returnToDraftAction = serverAction(
  { access: "procedure.author", input: versionIdSchema.extend({ comment: reasonSchema }) },
  async ({ user, input: { versionId, comment } }) => {
    await returnToDraft(user, versionId, comment);
    revalidatePath(await procedurePathOf(versionId), "layout");
    return { ok: true, message: "Returned to draft with your comment." };
  },
);

export const releaseAction = serverAction(
  { access: "procedure.release", input: versionIdSchema.extend({ password: z.string().min(1, { error: "enter your password to sign" }).max(1000) }) },
  async ({ user, input: { versionId, password } }) => {
    await signAndReleaseVersion(user, versionId, password);
    revalidatePath(await procedurePathOf(versionId), "layout");
    return { ok: true, message: "Released with your signature (approved for use). Operators can now run this version; it can no longer change." };
  },
);

export const withdrawAction = serverAction(
  { access: "procedure.release", input: versionIdSchema.extend({ reason: reasonSchema }) },
  async ({ user, input: { versionId, reason } }) => {
    await withdrawVersion(user, versionId, reason);
    revalidatePath(await procedurePathOf(versionId), "layout");
    return { ok: true, message: "Withdrawn. No new runs can start on it." };
  },
);

export const startNewDraftAction = serverAction({ access: "procedure.author", input: versionIdSchema }, async ({ user, input: { versionId } }) => {
  const { number } = await startNewDraft(user, versionId);
  redirect(`${await procedurePathOf(versionId)}/versions/${number}/edit`);
});
