"use server";

import { revalidatePath } from "next/cache";
import { clearSignInLimit } from "@/lib/auth/sign-in-limits";
import { serverAction } from "@/lib/forms/server-action";

export const clearLimitAction = serverAction({ access: "/admin/security" }, async ({ user: actor, form, origin }) => {
  const forgotten = await clearSignInLimit(actor, { email: String(form.get("email") ?? ""), address: String(form.get("address") ?? "") }, origin.address);
  revalidatePath("/admin/security");
  return { ok: true, message: `Cleared: ${forgotten} failed ${forgotten === 1 ? "attempt" : "attempts"} forgotten.` };
});
