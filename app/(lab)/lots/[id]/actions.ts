"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { requireActionPermission } from "@/lib/auth/guards";
import { issueLotCertificate } from "@/lib/certificates/issue-lot-certificate";
import { toActionState, type ActionState } from "@/lib/forms/action-state";
import { drawLotSample } from "@/lib/lots/sampling/draw-lot-sample";
import { readDrawForm, readSamplingPlanForm } from "@/lib/lots/sampling/read-lot-forms";
import { setLotSamplingPlan } from "@/lib/lots/sampling/set-lot-sampling-plan";

const lotIdSchema = z.uuid({ error: "No such lot." });

export async function setSamplingPlanAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const user = await requireActionPermission("lot.sample");
    const lotId = lotIdSchema.parse(form.get("lotId"));
    const plan = await setLotSamplingPlan(user, lotId, readSamplingPlanForm(form));
    revalidatePath(`/lots/${lotId}`);
    return { ok: true, message: `Plan set: code letter ${plan.codeLetter}, n = ${plan.sampleSize}, Ac ${plan.acceptanceNumber}, Re ${plan.rejectionNumber}.` };
  } catch (error) {
    return toActionState(error);
  }
}

export async function drawSampleAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const user = await requireActionPermission("lot.sample");
    const lotId = lotIdSchema.parse(form.get("lotId"));
    const { positions, seed } = await drawLotSample(user, lotId, readDrawForm(form));
    revalidatePath(`/lots/${lotId}`);
    return { ok: true, message: `${positions.length} cells drawn${seed === null ? "" : ` with seed ${seed}`}.` };
  } catch (error) {
    return toActionState(error);
  }
}

export async function issueLotCertificateAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const user = await requireActionPermission("certificate.sign");
    const lotId = lotIdSchema.parse(form.get("lotId"));
    const { number } = await issueLotCertificate(user, lotId, { password: String(form.get("password") ?? "") });
    revalidatePath(`/lots/${lotId}`);
    revalidatePath("/certificates");
    return { ok: true, message: `Lot certificate ${number} issued.` };
  } catch (error) {
    const state = toActionState(error);
    return state.fieldErrors ? { ...state, message: `${state.message} Nothing was signed.` } : state;
  }
}
