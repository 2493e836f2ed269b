import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { countUserSessions } from "@/db/sessions";
import { getLucia } from "@/lib/auth/lucia";
import { signIn, signInDelayMs, SIGN_IN_LIMITS } from "@/lib/auth/sign-in";
import { clearSignInLimit, listSignInLimits } from "@/lib/auth/sign-in-limits";
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

  // Issue 11 row 5: five wrong passwords from anywhere locked the account for everyone for 15 minutes.
  it(`refuses an address after ${SIGN_IN_LIMITS.perAccountAndAddress} failures for one account; the owner elsewhere is only slowed down`, async () => {
    await insertAdminFixture();
    await createUser(admin, { email: "aud@test.example", displayName: "Ana Auditor", role: "auditor", password: "auditor password 1" });
    const pauses: number[] = [];
    const pause = async (ms: number) => void pauses.push(ms);
    for (let i = 0; i < SIGN_IN_LIMITS.perAccountAndAddress; i++) {
      const r = await signIn({ email: "aud@test.example", password: `guess ${i}`, address: "203.0.113.66", pause });
      expect(r).toMatchObject({ ok: false, reason: "invalid" });
    }
    // The attacker's address is refused for this account, even with the right password.
    const attacker = await signIn({ email: "aud@test.example", password: "auditor password 1", address: "203.0.113.66", pause });
    expect(attacker).toMatchObject({ ok: false, reason: "rate-limited" });
    // The owner at the bench signs in: slowed down (exponentially, capped), not locked out.
    const owner = await signIn({ email: "aud@test.example", password: "auditor password 1", address: "127.0.0.11", pause });
    expect(owner.ok).toBe(true);
    expect(pauses.at(-1)).toBeGreaterThan(0);
    expect(pauses.at(-1)).toBeLessThanOrEqual(SIGN_IN_LIMITS.maxDelayMs);
    expect(signInDelayMs(SIGN_IN_LIMITS.slowDownAfter - 1)).toBe(0);
    expect(signInDelayMs(100)).toBe(SIGN_IN_LIMITS.maxDelayMs);
    // The window slides: an hour later the attacker's address may try again.
    const later = await signIn({ email: "aud@test.example", password: "auditor password 1", address: "203.0.113.66", now: new Date(Date.now() + 3_600_000), pause });
    expect(later.ok).toBe(true);
    expect((await listAuditEvents(getDb(), { action: "auth.sign-in-refused" })).length).toBe(1);
  });

  it("lets an administrator see a limit and clear it, audited", async () => {
    await insertAdminFixture();
    await createUser(admin, { email: "eng2@test.example", displayName: "Eda Engineer", role: "engineer", password: "engineer passphrase 2" });
    for (let i = 0; i < SIGN_IN_LIMITS.perAccountAndAddress; i++) {
      await signIn({ email: "eng2@test.example", password: `wrong ${i}`, address: "198.51.100.23", pause: async () => undefined });
    }
    const limits = await listSignInLimits();
    expect(limits.pairs).toEqual(expect.arrayContaining([expect.objectContaining({ email: "eng2@test.example", address: "198.51.100.23", failures: 5 })]));
    expect(await clearSignInLimit(admin, { email: "eng2@test.example", address: "198.51.100.23" })).toBe(5);
    const r = await signIn({ email: "eng2@test.example", password: "engineer passphrase 2", address: "198.51.100.23" });
    expect(r.ok).toBe(true);
    const cleared = await listAuditEvents(getDb(), { action: "auth.limit-cleared" });
    expect(cleared[0]).toMatchObject({ actorLabel: expect.stringContaining("Test Admin"), detail: { email: "eng2@test.example", address: "198.51.100.23", failuresForgotten: 5 } });
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
