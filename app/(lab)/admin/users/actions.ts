"use server";

import { revalidatePath } from "next/cache";
import { requireActionPermission } from "@/lib/auth/guards";
import { getRequestAddress } from "@/lib/auth/request-info";
import {
  changeRoleSchema,
  changeUserRole,
  createUser,
  createUserSchema,
  setActiveSchema,
  setUserActive,
} from "@/lib/auth/user-admin";
import { toActionState, type ActionState } from "@/lib/forms/action-state";
import { endSessionsAsAdmin, setPasswordAsAdmin } from "@/lib/auth/account-security";

export async function createUserAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const actor = await requireActionPermission("user.manage");
    const input = createUserSchema.parse(Object.fromEntries(form));
    const user = await createUser(actor, input, await getRequestAddress());
    revalidatePath("/admin/users");
    return { ok: true, message: `${user.displayName} can now sign in as ${user.email}.` };
  } catch (error) {
    return toActionState(error);
  }
}

export async function changeRoleAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const actor = await requireActionPermission("user.manage");
    const input = changeRoleSchema.parse(Object.fromEntries(form));
    const user = await changeUserRole(actor, input, await getRequestAddress());
    revalidatePath("/admin/users");
    return { ok: true, message: `${user.displayName} is now ${user.role}.` };
  } catch (error) {
    return toActionState(error);
  }
}

export async function setActiveAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const actor = await requireActionPermission("user.manage");
    const input = setActiveSchema.parse(Object.fromEntries(form));
    const user = await setUserActive(actor, input, await getRequestAddress());
    revalidatePath("/admin/users");
    return {
      ok: true,
      message: user.active ? `${user.displayName} can sign in again.` : `${user.displayName} is deactivated and signed out everywhere.`,
    };
  } catch (error) {
    return toActionState(error);
  }
}

export async function setPasswordAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const actor = await requireActionPermission("user.manage");
    const result = await setPasswordAsAdmin(actor, { userId: String(form.get("userId") ?? ""), password: String(form.get("password") ?? "") }, await getRequestAddress());
    revalidatePath("/admin/users");
    return { ok: true, message: `${result.displayName} has a new password; ${result.endedSessions} ${result.endedSessions === 1 ? "session was" : "sessions were"} signed out. Hand the password over in person.` };
  } catch (error) {
    return toActionState(error);
  }
}

export async function endSessionsAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const actor = await requireActionPermission("user.manage");
    const ended = await endSessionsAsAdmin(actor, String(form.get("userId") ?? ""), await getRequestAddress());
    revalidatePath("/admin/users");
    return { ok: true, message: `${ended} ${ended === 1 ? "session" : "sessions"} signed out.` };
  } catch (error) {
    return toActionState(error);
  }
}
