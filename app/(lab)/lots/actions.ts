"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { serverAction } from "@/lib/forms/server-action";
import { createLot, editLot, lotInputSchema } from "@/lib/lots/lot-records";
import { readLotForm } from "@/lib/specimens/record-forms";

export const saveLotAction = serverAction({ access: "specimen.manage", input: lotInputSchema, read: readLotForm }, async ({ user, input, form }) => {
  let id: string;
  const existing = z.uuid().optional().parse(form.get("id") || undefined);
  if (existing) {
    await editLot(user, existing, input);
    id = existing;
  } else {
    id = await createLot(user, input);
  }
  revalidatePath("/lots", "layout");
  revalidatePath("/specimens", "layout");
  redirect(`/lots/${id}`);
});
