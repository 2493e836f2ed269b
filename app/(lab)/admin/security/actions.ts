"use server";

import { revalidatePath } from "next/cache";
import { requireActionPermission } from "@/lib/auth/guards";
import { getRequestAddress } from "@/lib/auth/request-info";
import { clearSignInLimit } from "@/lib/auth/sign-in-limits";
import { toActionState, type ActionState } from "@/lib/forms/action-state";

export async function clearLimitAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const actor = await requireActionPermission("user.manage");
    const forgotten = await clearSignInLimit(actor, { email: String(form.get("email") ?? ""), address: String(form.get("address") ?? "") }, await getRequestAddress());
    revalidatePath("/admin/security");
    return { ok: true, message: `Cleared: ${forgotten} failed ${forgotten === 1 ? "attempt" : "attempts"} forgotten.` };
  } catch (error) {
    return toActionState(error);
  }
}
