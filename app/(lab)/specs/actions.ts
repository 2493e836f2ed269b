"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { serverAction } from "@/lib/forms/server-action";
import { createCellSpecification, editCellSpecification } from "@/lib/specs/cell-specifications";
import { cellSpecificationInputSchema } from "@/lib/specs/cell-specifications-input";
import { readSpecificationForm } from "@/lib/specs/spec-form";

export const saveSpecificationAction = serverAction(
  { access: "spec.manage", input: cellSpecificationInputSchema, read: readSpecificationForm },
  async ({ user, input, form }) => {
    let id: string;
    const existing = z.uuid().optional().parse(form.get("id") || undefined);
    if (existing) {
      await editCellSpecification(user, existing, input);
      id = existing;
    } else {
      id = await createCellSpecification(user, input);
    }
    revalidatePath("/specs", "layout");
    redirect(`/specs/${id}`);
  },
);
