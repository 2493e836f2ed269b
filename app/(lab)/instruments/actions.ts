"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { serverAction } from "@/lib/forms/server-action";
import { readInstrumentForm } from "@/lib/instruments/instrument-form";
import { createInstrument, deactivateInstrument, editInstrument, instrumentInputSchema, reactivateInstrument } from "@/lib/instruments/instruments";

export const saveInstrumentAction = serverAction(
  { access: "instrument.manage", input: instrumentInputSchema, read: readInstrumentForm },
  async ({ user, input, form }) => {
    const existing = z.uuid().optional().parse(form.get("id") || undefined);
    if (existing) await editInstrument(user, existing, input);
    else await createInstrument(user, input);
    revalidatePath("/instruments", "layout");
    redirect("/instruments");
  },
);

const inUseSchema = z.object({ id: z.uuid(), active: z.enum(["true", "false"]).transform((v) => v === "true") });

export const setInstrumentInUseAction = serverAction({ access: "instrument.manage", input: inUseSchema }, async ({ user, input: { id, active } }) => {
  const instrument = active ? await reactivateInstrument(user, id) : await deactivateInstrument(user, id);
  revalidatePath("/instruments", "layout");
  return { ok: true, message: active ? `${instrument.identifier} is back in use.` : `${instrument.identifier} is out of use: no run can start on it.` };
});
