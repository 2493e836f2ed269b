"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { issueLotCertificate } from "@/lib/certificates/issue-lot-certificate";
import type { ActionState } from "@/lib/forms/action-state";
import { serverAction } from "@/lib/forms/server-action";
import { drawLotSample } from "@/lib/lots/sampling/draw-lot-sample";
import { readDrawForm, readSamplingPlanForm } from "@/lib/lots/sampling/read-lot-forms";
import { setLotSamplingPlan } from "@/lib/lots/sampling/set-lot-sampling-plan";

const lotIdSchema = z.uuid({ error: "No such lot." });
const readLotId = (form: FormData) => lotIdSchema.parse(form.get("lotId"));

export const setSamplingPlanAction = serverAction({ access: "lot.sample" }, async ({ user, form }) => {
  const lotId = readLotId(form);
  const plan = await setLotSamplingPlan(user, lotId, readSamplingPlanForm(form));
  revalidatePath(`/lots/${lotId}`);
  return { ok: true, message: `Plan set: code letter ${plan.codeLetter}, n = ${plan.sampleSize}, Ac ${plan.acceptanceNumber}, Re ${plan.rejectionNumber}.` };
});

export const drawSampleAction = serverAction({ access: "lot.sample" }, async ({ user, form }) => {
  const lotId = readLotId(form);
  const { positions, seed } = await drawLotSample(user, lotId, readDrawForm(form));
  revalidatePath(`/lots/${lotId}`);
  return { ok: true, message: `${positions.length} cells drawn${seed === null ? "" : ` with seed ${seed}`}.` };
});

const nothingSigned = (state: ActionState): ActionState => (state.fieldErrors ? { ...state, message: `${state.message} Nothing was signed.` } : state);

export const issueLotCertificateAction = serverAction({ access: "certificate.sign", refused: nothingSigned }, async ({ user, form }) => {
  const lotId = readLotId(form);
  const { number } = await issueLotCertificate(user, lotId, { password: String(form.get("password") ?? "") });
  revalidatePath(`/lots/${lotId}`);
  revalidatePath("/certificates");
  return { ok: true, message: `Lot certificate ${number} issued.` };
});
