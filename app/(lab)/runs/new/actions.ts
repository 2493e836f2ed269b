"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { serverAction } from "@/lib/forms/server-action";
import { readLabToday } from "@/lib/instruments/lab-today";
import { startRun, startRunSchema } from "@/lib/runs/start-run";

const readStartForm = (form: FormData) => ({
  procedureVersionId: form.get("procedureVersionId"),
  specimenId: form.get("specimenId"),
  instrumentIds: form.getAll("instrumentIds"),
});

export const startRunAction = serverAction({ access: "/runs/new", input: startRunSchema, read: readStartForm }, async ({ user, input }) => {
  const { id: runId } = await startRun(user, input, readLabToday());
  revalidatePath("/runs");
  redirect(`/runs/${runId}`);
});
