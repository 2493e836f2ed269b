"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { serverAction } from "@/lib/forms/server-action";
import { readSpecimenForm } from "@/lib/specimens/record-forms";
import { createSpecimen, editSpecimen, specimenInputSchema } from "@/lib/specimens/specimens";

export const saveSpecimenAction = serverAction(
  { access: "specimen.manage", input: specimenInputSchema, read: readSpecimenForm },
  async ({ user, input, form }) => {
    let id: string;
    const existing = z.uuid().optional().parse(form.get("id") || undefined);
    if (existing) {
      await editSpecimen(user, existing, input);
      id = existing;
    } else {
      id = await createSpecimen(user, input);
    }
    revalidatePath("/specimens", "layout");
    revalidatePath("/lots", "layout");
    redirect(`/specimens/${id}`);
  },
);
