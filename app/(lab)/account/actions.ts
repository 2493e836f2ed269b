"use server";

import { redirect } from "next/navigation";
import { changeOwnPassword, signOutEverywhere } from "@/lib/auth/account-security";
import { requireActionPermission } from "@/lib/auth/guards";
import { getRequestAddress } from "@/lib/auth/request-info";
import { clearSessionCookie, getCurrentSession } from "@/lib/auth/session";
import { DomainError } from "@/lib/errors";
import { toActionState, type ActionState } from "@/lib/forms/action-state";

async function currentSession() {
  await requireActionPermission("workbench.enter");
  const session = await getCurrentSession();
  if (!session) throw new DomainError("unauthenticated", "Your session has ended. Sign in again.");
  return session;
}

export async function changeOwnPasswordAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const session = await currentSession();
    const { endedSessions } = await changeOwnPassword(session, { currentPassword: String(form.get("currentPassword") ?? ""), newPassword: String(form.get("newPassword") ?? "") }, await getRequestAddress());
    return { ok: true, message: `Your password is changed.${endedSessions > 0 ? ` ${endedSessions} other ${endedSessions === 1 ? "session was" : "sessions were"} signed out.` : ""}` };
  } catch (error) {
    return toActionState(error);
  }
}

export async function signOutEverywhereAction(): Promise<ActionState> {
  try {
    const session = await currentSession();
    await signOutEverywhere(session, await getRequestAddress());
    await clearSessionCookie();
  } catch (error) {
    return toActionState(error);
  }
  redirect("/sign-in?ended=1");
}
