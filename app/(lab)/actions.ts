"use server";

import { redirect } from "next/navigation";
import { clearSessionCookie, getCurrentSession } from "@/lib/auth/session";
import { signOut } from "@/lib/auth/sign-out";
import { serverAction } from "@/lib/forms/server-action";

/** Anyone may sign out, as anyone may open the sign-in page: without a session it only clears the cookie. */
export const signOutAction = serverAction.plain({ access: "/sign-in" }, async ({ origin }) => {
  const session = await getCurrentSession();
  if (session) await signOut(session, origin.address);
  await clearSessionCookie();
  redirect("/sign-in?ended=1");
});
