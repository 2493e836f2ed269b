"use server";

import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { safeNextPath } from "@/lib/auth/safe-next";
import { getRequestAddress } from "@/lib/auth/request-info";
import { setSessionCookie } from "@/lib/auth/session";
import { signIn, signInSchema } from "@/lib/auth/sign-in";
import { toActionState, type ActionState } from "@/lib/forms/action-state";

/** Public by nature: the caller is who they claim only once this succeeds. */
export async function signInAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  const parsed = signInSchema.safeParse({ email: formData.get("email"), password: formData.get("password") });
  if (!parsed.success) return toActionState(parsed.error);
  let result;
  try {
    result = await signIn({ ...parsed.data, address: await getRequestAddress(), client: (await headers()).get("user-agent") ?? undefined });
  } catch (error) {
    return toActionState(error);
  }
  if (!result.ok) return { ok: false, message: result.message };
  await setSessionCookie(result.sessionId);
  // Only local paths: a sign-in link must not be able to send someone to another site.
  redirect(safeNextPath(formData.get("next")));
}
