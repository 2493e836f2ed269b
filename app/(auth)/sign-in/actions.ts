"use server";

import { redirect } from "next/navigation";
import { safeNextPath } from "@/lib/auth/safe-next";
import { setSessionCookie } from "@/lib/auth/session";
import { signIn, signInSchema } from "@/lib/auth/sign-in";
import { serverAction } from "@/lib/forms/server-action";

const readSignInForm = (form: FormData) => ({ email: form.get("email"), password: form.get("password") });

/** Public by nature: the caller is who they claim only once this succeeds. */
export const signInAction = serverAction({ access: "/sign-in", input: signInSchema, read: readSignInForm }, async ({ input, form, origin }) => {
  const result = await signIn({ ...input, address: origin.address, client: origin.client });
  if (!result.ok) return { ok: false, message: result.message };
  await setSessionCookie(result.sessionId);
  // Only local paths: a sign-in link must not be able to send someone to another site.
  redirect(safeNextPath(form.get("next")));
});
