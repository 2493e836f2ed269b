"use server";

import { redirect } from "next/navigation";
import { changeOwnPassword, signOutEverywhere } from "@/lib/auth/account-security";
import { clearSessionCookie, getCurrentSession } from "@/lib/auth/session";
import { DomainError } from "@/lib/errors";
import { serverAction } from "@/lib/forms/server-action";

async function currentSession() {
  const session = await getCurrentSession();
  if (!session) throw new DomainError("unauthenticated", "Your session has ended. Sign in again.");
  return session;
}

export const changeOwnPasswordAction = serverAction({ access: "/account" }, async ({ form, origin }) => {
  const session = await currentSession();
  const { endedSessions } = await changeOwnPassword(session, { currentPassword: String(form.get("currentPassword") ?? ""), newPassword: String(form.get("newPassword") ?? "") }, origin.address);
  return { ok: true, message: `Your password is changed.${endedSessions > 0 ? ` ${endedSessions} other ${endedSessions === 1 ? "session was" : "sessions were"} signed out.` : ""}` };
});

export const signOutEverywhereAction = serverAction({ access: "/account" }, async ({ origin }) => {
  const session = await currentSession();
  await signOutEverywhere(session, origin.address);
  await clearSessionCookie();
  redirect("/sign-in?ended=1");
});
