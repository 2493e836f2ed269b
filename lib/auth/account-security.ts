import "server-only";
import { z } from "zod";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { deleteOtherSessions, deleteUserSessions, listUserSessions, sessionHandle, type SessionView } from "@/db/sessions";
import { getUser, getUserCredentials, updateUser } from "@/db/users";
import { DomainError } from "@/lib/errors";
import { hashPassword, verifyPassword } from "./password";
import { checkPassword } from "./password-policy";
import { can } from "./permissions";
import type { CurrentSession } from "./session";
import type { SignedInUser } from "./signed-in-user";

const label = (u: { displayName: string; email: string }) => `${u.displayName} <${u.email}>`;

export const adminSetPasswordSchema = z.object({
  userId: z.string().min(1).max(100),
  password: z.string().max(1000),
});

/**
 * An administrator sets a new password for someone else (they forgot theirs). Every session of that
 * person ends in the same transaction, and the event is audited (never the password itself).
 */
export async function setPasswordAsAdmin(actor: SignedInUser, input: z.input<typeof adminSetPasswordSchema>, address?: string): Promise<{ displayName: string; endedSessions: number }> {
  if (!can(actor.role, "user.manage")) throw new DomainError("forbidden", "Only an administrator sets another person's password.");
  const { userId, password } = adminSetPasswordSchema.parse(input);
  if (userId === actor.id) throw new DomainError("conflict", "Change your own password on Your account, where your current password is asked again.");
  const target = await getUser(getDb(), userId);
  if (!target) throw new DomainError("not-found", "No such user.");
  const problem = checkPassword(password, { email: target.email });
  if (problem) throw new DomainError("invalid", problem, { field: "password" });
  const passwordHash = await hashPassword(password);
  return getDb().transaction().execute(async (tx) => {
    const locked = await getUser(tx, userId, { forUpdate: true });
    if (!locked) throw new DomainError("not-found", "No such user.");
    await updateUser(tx, userId, { passwordHash });
    const endedSessions = await deleteUserSessions(tx, userId);
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: label(actor),
      action: "user.set-password",
      entityType: "user",
      entityId: userId,
      detail: { for: label(locked), endedSessions },
      address,
    });
    return { displayName: locked.displayName, endedSessions };
  });
}

export const changeOwnPasswordSchema = z.object({
  currentPassword: z.string().min(1, "Enter your current password.").max(1000),
  newPassword: z.string().max(1000),
});

/**
 * A person changes their own password: the current one is asked again. Their other sessions end (a
 * stolen session must not outlive the change); this one stays open.
 */
export async function changeOwnPassword(session: CurrentSession, input: z.input<typeof changeOwnPasswordSchema>, address?: string): Promise<{ endedSessions: number }> {
  const { currentPassword, newPassword } = changeOwnPasswordSchema.parse(input);
  const me = session.user;
  const credentials = await getUserCredentials(getDb(), me.email);
  if (!credentials || !(await verifyPassword(credentials.passwordHash, currentPassword))) {
    await recordAuditEvent(getDb(), { actorId: me.id, actorLabel: label(me), action: "user.change-password-refused", entityType: "user", entityId: me.id, detail: { reason: "current password not right" }, address });
    throw new DomainError("invalid", "Your current password is not right. Nothing was changed.", { field: "currentPassword" });
  }
  if (newPassword === currentPassword) throw new DomainError("invalid", "The new password is the same as the current one.", { field: "newPassword" });
  const problem = checkPassword(newPassword, { email: me.email });
  if (problem) throw new DomainError("invalid", problem, { field: "newPassword" });
  const passwordHash = await hashPassword(newPassword);
  return getDb().transaction().execute(async (tx) => {
    await updateUser(tx, me.id, { passwordHash });
    const endedSessions = await deleteOtherSessions(tx, me.id, session.sessionId);
    await recordAuditEvent(tx, { actorId: me.id, actorLabel: label(me), action: "user.change-password", entityType: "user", entityId: me.id, detail: { endedSessions }, address });
    return { endedSessions };
  });
}

/** "Sign out everywhere": every session of the person ends, this one included. */
export async function signOutEverywhere(session: CurrentSession, address?: string): Promise<number> {
  return getDb().transaction().execute(async (tx) => {
    const ended = await deleteUserSessions(tx, session.user.id);
    await recordAuditEvent(tx, { actorId: session.user.id, actorLabel: label(session.user), action: "auth.sign-out-everywhere", entityType: "user", entityId: session.user.id, detail: { endedSessions: ended }, address });
    return ended;
  });
}

/** An administrator ends every session of someone else (a lost laptop). */
export async function endSessionsAsAdmin(actor: SignedInUser, userId: string, address?: string): Promise<number> {
  if (!can(actor.role, "user.manage")) throw new DomainError("forbidden", "Only an administrator ends another person's sessions.");
  return getDb().transaction().execute(async (tx) => {
    const target = await getUser(tx, userId);
    if (!target) throw new DomainError("not-found", "No such user.");
    const ended = await deleteUserSessions(tx, userId);
    await recordAuditEvent(tx, { actorId: actor.id, actorLabel: label(actor), action: "user.end-sessions", entityType: "user", entityId: userId, detail: { for: label(target), endedSessions: ended }, address });
    return ended;
  });
}

export async function listMySessions(session: CurrentSession): Promise<(SessionView & { current: boolean })[]> {
  const sessions = await listUserSessions(getDb(), session.user.id);
  return sessions.map((s) => ({ ...s, current: s.handle === sessionHandle(session.sessionId) }));
}

