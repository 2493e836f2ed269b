import { beforeEach, describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { DomainError } from "@/lib/errors";
import type { ActionState } from "@/lib/forms/action-state";

// The wrapper's own checks, without Next.js: the session and the request headers are stand-ins.
const session = vi.hoisted(() => ({ current: null as null | { user: { id: string; role: string; displayName: string } } }));
const requestHeaders = vi.hoisted(() => ({ current: new Headers() }));
vi.mock("@/lib/auth/session", () => ({ getCurrentSession: async () => session.current }));
vi.mock("next/headers", () => ({ headers: async () => requestHeaders.current }));
vi.mock("next/navigation", () => ({ unstable_rethrow: () => undefined, forbidden: () => { throw new Error("forbidden"); }, redirect: () => { throw new Error("redirect"); } }));

const { serverAction } = await import("@/lib/forms/server-action");
const { currentAuditContext } = await import("@/db/audit-context");

const prev: ActionState = { ok: false };
const form = (fields: Record<string, string>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.set(k, v);
  return f;
};
const signInAs = (role: string) => (session.current = { user: { id: "u1", role, displayName: "Dana" } });

describe("serverAction", () => {
  const ran = vi.fn();
  const action = serverAction({ access: "/specimens/new", input: z.object({ name: z.string().min(1), count: z.coerce.number<unknown>().int() }) }, async ({ input }) => {
    ran(input);
    return { ok: true, message: "Saved." };
  });

  beforeEach(() => {
    ran.mockReset();
    session.current = null;
    requestHeaders.current = new Headers({ "x-forwarded-for": "192.0.2.7, 10.0.0.1", "user-agent": "BenchBrowser/1" });
  });

  it("refuses without a session, in plain words, before running anything", async () => {
    const state = await action(prev, form({ name: "A", count: "1" }));
    expect(state).toEqual({ ok: false, message: "Your session has ended. Sign in again." });
    expect(ran).not.toHaveBeenCalled();
  });

  it("refuses a role the route's access does not admit", async () => {
    signInAs("auditor");
    const state = await action(prev, form({ name: "A", count: "1" }));
    expect(state).toEqual({ ok: false, message: "Your role does not allow this action." });
    expect(ran).not.toHaveBeenCalled();
  });

  it("runs for a role the route admits, with the parsed input", async () => {
    signInAs("operator");
    expect(await action(prev, form({ name: "A", count: "3" }))).toEqual({ ok: true, message: "Saved." });
    expect(ran).toHaveBeenCalledWith({ name: "A", count: 3 });
  });

  it("turns zod's own messages into plain sentences, with no field path in what is shown", async () => {
    signInAs("operator");
    const state = await action(prev, form({ name: "", count: "x" }));
    expect(state.ok).toBe(false);
    expect(state.message).toBe("Some fields need attention.");
    expect(state.fieldErrors).toEqual({ name: ["Fill this in."], count: ["Enter a number here."] });
    for (const text of Object.values(state.fieldErrors!).flat()) expect(text).not.toMatch(/expected|received|Invalid|Too small/);
  });

  it("maps a DomainError to its message and field", async () => {
    signInAs("operator");
    const failing = serverAction({ access: "specimen.manage" }, async () => {
      throw new DomainError("conflict", "A specimen with this identifier exists.", { field: "identifier" });
    });
    expect(await failing(prev, form({}))).toEqual({
      ok: false,
      message: "A specimen with this identifier exists.",
      fieldErrors: { identifier: ["A specimen with this identifier exists."] },
    });
  });

  it("refuses text the proxy found unstorable", async () => {
    signInAs("operator");
    requestHeaders.current.set("x-cellwright-unstorable", encodeURIComponent(JSON.stringify({ field: "name", message: "The name holds a character that cannot be stored." })));
    const state = await action(prev, form({ name: "A", count: "1" }));
    expect(state.message).toBe("The name holds a character that cannot be stored.");
    expect(ran).not.toHaveBeenCalled();
  });

  it("runs the body inside an audit context holding the caller's address and browser", async () => {
    signInAs("operator");
    let seen: unknown;
    const audited = serverAction({ access: "specimen.manage" }, async () => {
      seen = currentAuditContext();
      return { ok: true };
    });
    await audited(prev, form({}));
    expect(seen).toEqual({ address: "192.0.2.7", client: "BenchBrowser/1" });
    expect(currentAuditContext()).toBeUndefined();
  });
});
