import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { countUserSessions } from "@/db/sessions";
import { getLucia } from "@/lib/auth/lucia";
import { signIn, SIGN_IN_LIMITS } from "@/lib/auth/sign-in";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { changeUserRole, createUser, setUserActive } from "@/lib/auth/user-admin";
import { withOwnerClient } from "../support/test-database";

const admin: SignedInUser = { id: "admin-fixture", email: "admin@test.example", displayName: "Test Admin", role: "admin" };

async function insertAdminFixture() {
  await getDb()
    .insertInto("app_user")
    .values({ id: admin.id, email: admin.email, display_name: admin.displayName, role: "admin", password_hash: "x" })
    .onConflict((oc) => oc.doNothing())
    .execute();
}

describe("sign-in, sessions and deactivation", () => {
  it("creates a user, signs in, validates the session, and ends it on deactivation", async () => {
    await insertAdminFixture();
    const user = await createUser(admin, { email: "Op@Test.example", displayName: "Ola Operator", role: "operator", password: "correct horse battery" });
    expect(user.email).toBe("op@test.example");

    const result = await signIn({ email: "op@test.example", password: "correct horse battery", address: "127.0.0.9" });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const { session, user: sessionUser } = await getLucia().validateSession(result.sessionId);
    expect(session?.id).toBe(result.sessionId);
    expect(sessionUser?.role).toBe("operator");

    await setUserActive(admin, { userId: user.id, active: false });
    expect(await countUserSessions(getDb(), user.id)).toBe(0);
    const after = await getLucia().validateSession(result.sessionId);
    expect(after.session).toBeNull();

    const again = await signIn({ email: "op@test.example", password: "correct horse battery", address: "127.0.0.9" });
    expect(again).toMatchObject({ ok: false, reason: "deactivated" });

    const actions = (await listAuditEvents(getDb(), { entityId: user.id })).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(["user.create", "auth.sign-in", "user.deactivate", "auth.sign-in-failed"]));
  });

  it("refuses a wrong password and an unknown user with the same message", async () => {
    await insertAdminFixture();
    await createUser(admin, { email: "eng@test.example", displayName: "Eli Engineer", role: "engineer", password: "long enough secret" });
    const wrong = await signIn({ email: "eng@test.example", password: "not it", address: "127.0.0.10" });
    const unknown = await signIn({ email: "ghost@test.example", password: "not it", address: "127.0.0.10" });
    expect(wrong.ok).toBe(false);
    expect(unknown.ok).toBe(false);
    if (wrong.ok || unknown.ok) return;
    expect(wrong.message).toBe(unknown.message);
    const failed = await listAuditEvents(getDb(), { action: "auth.sign-in-failed" });
    expect(failed.map((e) => e.actorLabel)).toEqual(expect.arrayContaining(["ghost@test.example"]));
  });

  it(`locks an account after ${SIGN_IN_LIMITS.perAccount} failures, even with the right password`, async () => {
    await insertAdminFixture();
    await createUser(admin, { email: "aud@test.example", displayName: "Ana Auditor", role: "auditor", password: "auditor password 1" });
    for (let i = 0; i < SIGN_IN_LIMITS.perAccount; i++) {
      const r = await signIn({ email: "aud@test.example", password: `guess ${i}`, address: `10.9.0.${i}` });
      expect(r).toMatchObject({ ok: false, reason: "invalid" });
    }
    const locked = await signIn({ email: "aud@test.example", password: "auditor password 1", address: "127.0.0.11" });
    expect(locked).toMatchObject({ ok: false, reason: "rate-limited" });
    // The window slides: an hour later the right password works again.
    const later = await signIn({ email: "aud@test.example", password: "auditor password 1", address: "127.0.0.11", now: new Date(Date.now() + 3_600_000) });
    expect(later.ok).toBe(true);
    expect((await listAuditEvents(getDb(), { action: "auth.sign-in-refused" })).length).toBe(1);
  });

  it(`limits one address to ${SIGN_IN_LIMITS.perAddress} failures across accounts`, async () => {
    for (let i = 0; i < SIGN_IN_LIMITS.perAddress; i++) {
      await signIn({ email: `probe${i}@test.example`, password: "x", address: "192.0.2.7" });
    }
    const r = await signIn({ email: "someone-new@test.example", password: "x", address: "192.0.2.7" });
    expect(r).toMatchObject({ ok: false, reason: "rate-limited" });
  });

  it("keeps the last administrator and refuses self-deactivation", async () => {
    await insertAdminFixture();
    await expect(changeUserRole(admin, { userId: admin.id, role: "auditor" })).rejects.toThrow(/last active administrator/);
    await expect(setUserActive(admin, { userId: admin.id, active: false })).rejects.toThrow(/your own account/);
    const row = await getDb().selectFrom("app_user").select(["role", "active"]).where("id", "=", admin.id).executeTakeFirstOrThrow();
    expect(row).toEqual({ role: "admin", active: true });
  });
});

describe("audit trail is append-only", () => {
  it("refuses UPDATE, DELETE and TRUNCATE on audit_event", async () => {
    await insertAdminFixture();
    await createUser(admin, { email: "x@test.example", displayName: "Xavi Example", role: "operator", password: "0123456789ab" });
    const db = getDb();
    // The app's role has no right to; the owner role has, and the trigger refuses it.
    await expect(sql`update audit_event set action = 'tampered'`.execute(db)).rejects.toThrow(/permission denied/);
    await expect(sql`delete from audit_event`.execute(db)).rejects.toThrow(/permission denied/);
    await expect(sql`truncate audit_event`.execute(db)).rejects.toThrow(/permission denied/);
    await withOwnerClient(async (owner) => {
      await expect(owner.query(`update audit_event set action = 'tampered'`)).rejects.toThrow(/append-only/);
      await expect(owner.query(`delete from audit_event`)).rejects.toThrow(/append-only/);
      await expect(owner.query(`truncate audit_event`)).rejects.toThrow(/append-only/);
    });
    const rows = await listAuditEvents(db, {});
    expect(rows.length).toBeGreaterThan(0);
    expect(rows.every((r) => r.action !== "tampered")).toBe(true);
  });

  it("rolls the audit entry back with a change that fails", async () => {
    await insertAdminFixture();
    await createUser(admin, { email: "dup@test.example", displayName: "Dee Duplicate", role: "operator", password: "0123456789ab" });
    const before = (await listAuditEvents(getDb(), { action: "user.create" })).length;
    await expect(
      createUser(admin, { email: "dup@test.example", displayName: "Dee Again", role: "operator", password: "0123456789ab" }),
    ).rejects.toThrow();
    expect((await listAuditEvents(getDb(), { action: "user.create" })).length).toBe(before);
  });
});
