"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { requireActionPermission } from "@/lib/auth/guards";
import { toActionState, type ActionState } from "@/lib/forms/action-state";
import { createLot, editLot, lotInputSchema } from "@/lib/lots/lot-records";
import { readLotForm } from "@/lib/specimens/record-forms";

export async function saveLotAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  let id: string;
  try {
    const user = await requireActionPermission("specimen.manage");
    const input = lotInputSchema.parse(readLotForm(form));
    const existing = z.uuid().optional().parse(form.get("id") || undefined);
    if (existing) {
      await editLot(user, existing, input);
      id = existing;
    } else {
      id = await createLot(user, input);
    }
    revalidatePath("/lots", "layout");
    revalidatePath("/specimens", "layout");
  } catch (error) {
    return toActionState(error);
  }
  redirect(`/lots/${id}`);
}
