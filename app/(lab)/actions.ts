"use server";

import { redirect } from "next/navigation";
import { getRequestAddress } from "@/lib/auth/request-info";
import { clearSessionCookie, getCurrentSession } from "@/lib/auth/session";
import { signOut } from "@/lib/auth/sign-out";

export async function signOutAction(): Promise<void> {
  const session = await getCurrentSession();
  if (session) await signOut(session, await getRequestAddress());
  await clearSessionCookie();
  redirect("/sign-in?ended=1");
}
