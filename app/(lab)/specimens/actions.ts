"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { requireActionPermission } from "@/lib/auth/guards";
import { toActionState, type ActionState } from "@/lib/forms/action-state";
import { readSpecimenForm } from "@/lib/specimens/record-forms";
import { createSpecimen, editSpecimen, specimenInputSchema } from "@/lib/specimens/specimens";

export async function saveSpecimenAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  let id: string;
  try {
    const user = await requireActionPermission("specimen.manage");
    const input = specimenInputSchema.parse(readSpecimenForm(form));
    const existing = z.uuid().optional().parse(form.get("id") || undefined);
    if (existing) {
      await editSpecimen(user, existing, input);
      id = existing;
    } else {
      id = await createSpecimen(user, input);
    }
    revalidatePath("/specimens", "layout");
    revalidatePath("/lots", "layout");
  } catch (error) {
    return toActionState(error);
  }
  redirect(`/specimens/${id}`);
}
