import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { countUserSessions } from "@/db/sessions";
import { changeOwnPassword, endSessionsAsAdmin, listMySessions, setPasswordAsAdmin, signOutEverywhere } from "@/lib/auth/account-security";
import { signIn } from "@/lib/auth/sign-in";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { createUser } from "@/lib/auth/user-admin";
import { makeUser } from "./fixtures";

async function signedIn(email: string, password: string, address: string) {
  const r = await signIn({ email, password, address, client: "Test browser 1.0" });
  if (!r.ok) throw new Error(r.message);
  return { sessionId: r.sessionId, user: r.user };
}

describe("passwords and sessions", () => {
  it("an administrator sets a new password: audited, every session of that person ends, the new password works", async () => {
    const admin = await makeUser("admin", "Ada Admin");
    const op = await createUser(admin, { email: "olu@test.example", displayName: "Olu Operator", role: "operator", password: "first passphrase here" });
    await signedIn("olu@test.example", "first passphrase here", "192.0.2.1");
    await signedIn("olu@test.example", "first passphrase here", "192.0.2.2");
    expect(await countUserSessions(getDb(), op.id)).toBe(2);

    await expect(setPasswordAsAdmin(admin, { userId: op.id, password: "short" })).rejects.toThrow(/at least 12 characters/);
    await expect(setPasswordAsAdmin(admin, { userId: op.id, password: "olu@test.example again" })).rejects.toThrow(/e-mail address/);
    const engineer: SignedInUser = await makeUser("engineer", "Eno Engineer");
    await expect(setPasswordAsAdmin(engineer, { userId: op.id, password: "a fresh passphrase" })).rejects.toThrow(/Only an administrator/);
    await expect(setPasswordAsAdmin(admin, { userId: admin.id, password: "a fresh passphrase" })).rejects.toThrow(/Your account/);
    expect(await countUserSessions(getDb(), op.id)).toBe(2);

    expect(await setPasswordAsAdmin(admin, { userId: op.id, password: "a fresh passphrase" })).toEqual({ displayName: "Olu Operator", endedSessions: 2 });
    expect(await countUserSessions(getDb(), op.id)).toBe(0);
    expect((await signIn({ email: "olu@test.example", password: "first passphrase here", address: "192.0.2.3" })).ok).toBe(false);
    expect((await signIn({ email: "olu@test.example", password: "a fresh passphrase", address: "192.0.2.3" })).ok).toBe(true);
    const [event] = await listAuditEvents(getDb(), { action: "user.set-password" });
    expect(event).toMatchObject({ actorLabel: expect.stringContaining("Ada Admin"), entityId: op.id, detail: { endedSessions: 2 } });
    expect(JSON.stringify(event)).not.toContain("a fresh passphrase");

    await signedIn("olu@test.example", "a fresh passphrase", "192.0.2.4");
    expect(await endSessionsAsAdmin(admin, op.id)).toBe(2);
  });

  it("a person changes their own password with the current one; other sessions end, this one stays", async () => {
    const admin = await makeUser("admin", "Ada Admin");
    await createUser(admin, { email: "ena@test.example", displayName: "Ena Engineer", role: "engineer", password: "my current passphrase" });
    const here = await signedIn("ena@test.example", "my current passphrase", "198.51.100.1");
    await signedIn("ena@test.example", "my current passphrase", "198.51.100.2");
    const sessions = await listMySessions(here);
    expect(sessions).toHaveLength(2);
    expect(sessions.filter((s) => s.current)).toHaveLength(1);
    expect(sessions.map((s) => s.address).sort()).toEqual(["198.51.100.1", "198.51.100.2"]);
    expect(sessions[0]!.client).toBe("Test browser 1.0");
    expect(JSON.stringify(sessions)).not.toContain(here.sessionId);

    await expect(changeOwnPassword(here, { currentPassword: "not it", newPassword: "a new long passphrase" })).rejects.toThrow(/current password is not right/);
    await expect(changeOwnPassword(here, { currentPassword: "my current passphrase", newPassword: "password1234" })).rejects.toThrow(/breaches/);
    expect(await changeOwnPassword(here, { currentPassword: "my current passphrase", newPassword: "a new long passphrase" })).toEqual({ endedSessions: 1 });
    expect((await listMySessions(here)).map((s) => s.current)).toEqual([true]);
    expect((await listAuditEvents(getDb(), { action: "user.change-password-refused" })).length).toBe(1);

    expect(await signOutEverywhere(here)).toBe(1);
    expect(await countUserSessions(getDb(), here.user.id)).toBe(0);
    expect((await listAuditEvents(getDb(), { action: "auth.sign-out-everywhere" }))[0]).toMatchObject({ entityId: here.user.id, detail: { endedSessions: 1 } });
  });
});
