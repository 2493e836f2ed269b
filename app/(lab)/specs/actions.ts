"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { requireActionPermission } from "@/lib/auth/guards";
import { toActionState, type ActionState } from "@/lib/forms/action-state";
import { createCellSpecification, editCellSpecification } from "@/lib/specs/cell-specifications";
import { cellSpecificationInputSchema } from "@/lib/specs/cell-specifications-input";
import { readSpecificationForm } from "@/lib/specs/spec-form";

export async function saveSpecificationAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  let id: string;
  try {
    const user = await requireActionPermission("spec.manage");
    const input = cellSpecificationInputSchema.parse(readSpecificationForm(form));
    const existing = z.uuid().optional().parse(form.get("id") || undefined);
    if (existing) {
      await editCellSpecification(user, existing, input);
      id = existing;
    } else {
      id = await createCellSpecification(user, input);
    }
    revalidatePath("/specs", "layout");
  } catch (error) {
    return toActionState(error);
  }
  redirect(`/specs/${id}`);
}
