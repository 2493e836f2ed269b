"use server";

import { revalidatePath } from "next/cache";
import { endSessionsAsAdmin, setPasswordAsAdmin } from "@/lib/auth/account-security";
import {
  changeRoleSchema,
  changeUserRole,
  createUser,
  createUserSchema,
  setActiveSchema,
  setUserActive,
} from "@/lib/auth/user-admin";
import { serverAction } from "@/lib/forms/server-action";

export const createUserAction = serverAction({ access: "/admin/users", input: createUserSchema }, async ({ user: actor, input, origin }) => {
  const user = await createUser(actor, input, origin.address);
  revalidatePath("/admin/users");
  return { ok: true, message: `${user.displayName} can now sign in as ${user.email}.` };
});

export const changeRoleAction = serverAction({ access: "/admin/users", input: changeRoleSchema }, async ({ user: actor, input, origin }) => {
  const user = await changeUserRole(actor, input, origin.address);
  revalidatePath("/admin/users");
  return { ok: true, message: `${user.displayName} is now ${user.role}.` };
});

export const setActiveAction = serverAction({ access: "/admin/users", input: setActiveSchema }, async ({ user: actor, input, origin }) => {
  const user = await setUserActive(actor, input, origin.address);
  revalidatePath("/admin/users");
  return {
    ok: true,
    message: user.active ? `${user.displayName} can sign in again.` : `${user.displayName} is deactivated and signed out everywhere.`,
  };
});

export const setPasswordAction = serverAction({ access: "/admin/users" }, async ({ user: actor, form, origin }) => {
  const result = await setPasswordAsAdmin(actor, { userId: String(form.get("userId") ?? ""), password: String(form.get("password") ?? "") }, origin.address);
  revalidatePath("/admin/users");
  return { ok: true, message: `${result.displayName} has a new password; ${result.endedSessions} ${result.endedSessions === 1 ? "session was" : "sessions were"} signed out. Hand the password over in person.` };
});

export const endSessionsAction = serverAction({ access: "/admin/users" }, async ({ user: actor, form, origin }) => {
  const ended = await endSessionsAsAdmin(actor, String(form.get("userId") ?? ""), origin.address);
  revalidatePath("/admin/users");
  return { ok: true, message: `${ended} ${ended === 1 ? "session" : "sessions"} signed out.` };
});
