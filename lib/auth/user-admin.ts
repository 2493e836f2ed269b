import "server-only";
import { z } from "zod";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { deleteUserSessions } from "@/db/sessions";
import { countActiveAdmins, getUser, insertUser, updateUser, type UserView } from "@/db/users";
import { DomainError } from "@/lib/errors";
import { newUserId } from "./lucia";
import { hashPassword, passwordSchema } from "./password";
import { refusePasswordWithEmail } from "./password-policy";
import { ROLES } from "./permissions";
import type { SignedInUser } from "./signed-in-user";

export const createUserSchema = z
  .object({
    email: z.email("Enter a valid e-mail address.").transform((e) => e.toLowerCase()),
    displayName: z.string().trim().min(2, "Enter the person's name.").max(120, "Use at most 120 characters for the name."),
    role: z.enum(ROLES, "Choose a role."),
    password: passwordSchema,
  })
  .superRefine((v, ctx) => refusePasswordWithEmail(v, ctx));

export const changeRoleSchema = z.object({ userId: z.string().min(1), role: z.enum(ROLES, "Choose a role.") });
export const setActiveSchema = z.object({ userId: z.string().min(1), active: z.enum(["true", "false"]).transform((v) => v === "true") });

const label = (u: { displayName: string; email: string }) => `${u.displayName} <${u.email}>`;
const snapshot = (u: UserView) => ({ email: u.email, displayName: u.displayName, role: u.role, active: u.active });

export async function createUser(actor: SignedInUser, input: z.infer<typeof createUserSchema>, address?: string) {
  const passwordHash = await hashPassword(input.password);
  return getDb().transaction().execute(async (tx) => {
    const user = await insertUser(tx, { id: newUserId(), email: input.email, displayName: input.displayName, role: input.role, passwordHash });
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: label(actor),
      action: "user.create",
      entityType: "user",
      entityId: user.id,
      after: snapshot(user),
      address,
    });
    return user;
  });
}

export async function changeUserRole(actor: SignedInUser, input: z.infer<typeof changeRoleSchema>, address?: string) {
  return getDb().transaction().execute(async (tx) => {
    const before = await getUser(tx, input.userId, { forUpdate: true });
    if (!before) throw new DomainError("not-found", "No such user.");
    if (before.role === input.role) return before;
    if (before.role === "admin" && before.active && (await countActiveAdmins(tx)) <= 1) {
      throw new DomainError("conflict", "This is the last active administrator; make someone else an administrator first.");
    }
    const after = await updateUser(tx, before.id, { role: input.role });
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: label(actor),
      action: "user.change-role",
      entityType: "user",
      entityId: before.id,
      before: snapshot(before),
      after: snapshot(after),
      address,
    });
    return after;
  });
}

/** Deactivating ends every session of the user in the same transaction, so they are out at once. */
export async function setUserActive(actor: SignedInUser, input: z.infer<typeof setActiveSchema>, address?: string) {
  return getDb().transaction().execute(async (tx) => {
    const before = await getUser(tx, input.userId, { forUpdate: true });
    if (!before) throw new DomainError("not-found", "No such user.");
    if (before.active === input.active) return before;
    if (!input.active && before.id === actor.id) {
      throw new DomainError("conflict", "You cannot deactivate your own account.");
    }
    if (!input.active && before.role === "admin" && (await countActiveAdmins(tx)) <= 1) {
      throw new DomainError("conflict", "This is the last active administrator.");
    }
    const after = await updateUser(tx, before.id, { active: input.active });
    const endedSessions = input.active ? 0 : await deleteUserSessions(tx, before.id);
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: label(actor),
      action: input.active ? "user.reactivate" : "user.deactivate",
      entityType: "user",
      entityId: before.id,
      before: snapshot(before),
      after: snapshot(after),
      detail: input.active ? undefined : { endedSessions },
      address,
    });
    return after;
  });
}
