"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { requireActionPermission } from "@/lib/auth/guards";
import { toActionState, type ActionState } from "@/lib/forms/action-state";
import { readInstrumentForm } from "@/lib/instruments/instrument-form";
import { createInstrument, deactivateInstrument, editInstrument, instrumentInputSchema, reactivateInstrument } from "@/lib/instruments/instruments";

export async function saveInstrumentAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const user = await requireActionPermission("instrument.manage");
    const input = instrumentInputSchema.parse(readInstrumentForm(form));
    const existing = z.uuid().optional().parse(form.get("id") || undefined);
    if (existing) await editInstrument(user, existing, input);
    else await createInstrument(user, input);
    revalidatePath("/instruments", "layout");
  } catch (error) {
    return toActionState(error);
  }
  redirect("/instruments");
}

const inUseSchema = z.object({ id: z.uuid(), active: z.enum(["true", "false"]).transform((v) => v === "true") });

export async function setInstrumentInUseAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const user = await requireActionPermission("instrument.manage");
    const { id, active } = inUseSchema.parse(Object.fromEntries(form));
    const instrument = active ? await reactivateInstrument(user, id) : await deactivateInstrument(user, id);
    revalidatePath("/instruments", "layout");
    return { ok: true, message: active ? `${instrument.identifier} is back in use.` : `${instrument.identifier} is out of use: no run can start on it.` };
  } catch (error) {
    return toActionState(error);
  }
}
