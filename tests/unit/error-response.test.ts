import { describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { toErrorResponse } from "@/lib/api/error-response";
import { DomainError } from "@/lib/errors";
import { toActionState } from "@/lib/forms/action-state";

describe("toErrorResponse", () => {
  it("answers a zod error with 422 and the field paths", async () => {
    const schema = z.object({ cell: z.object({ ratedCapacityMah: z.number().positive() }) });
    const r = schema.safeParse({ cell: { ratedCapacityMah: -5 } });
    const res = toErrorResponse(r.error);
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.code).toBe("invalid");
    expect(body.error.fields[0].path).toBe("cell.ratedCapacityMah");
  });

  it("answers a domain error with its own status and message", async () => {
    const res = toErrorResponse(new DomainError("forbidden", "Your role does not allow this."));
    expect(res.status).toBe(403);
    expect((await res.json()).error).toEqual({ code: "forbidden", message: "Your role does not allow this." });
  });

  it("translates a unique violation from PostgreSQL into a conflict", async () => {
    const pgError = Object.assign(new Error("duplicate key"), { code: "23505", constraint: "app_user_email_key" });
    const res = toErrorResponse(pgError);
    expect(res.status).toBe(409);
    expect((await res.json()).error.message).toMatch(/already exists/);
  });

  it("hides an unknown error behind a generic 500 and logs the real one", async () => {
    const log = vi.fn();
    const secret = new Error("connection string postgres://secret@db");
    const res = toErrorResponse(secret, log);
    expect(res.status).toBe(500);
    const text = await res.text();
    expect(text).not.toContain("secret");
    expect(log).toHaveBeenCalledWith(secret);
  });
});

describe("toActionState", () => {
  it("groups zod issues per field for the form", () => {
    const r = z.object({ email: z.email("Enter a valid e-mail address.") }).safeParse({ email: "nope" });
    const s = toActionState(r.error);
    expect(s.ok).toBe(false);
    expect(s.fieldErrors?.email).toEqual(["Enter a valid e-mail address."]);
  });

  it("keeps a domain message and hides unknown errors", () => {
    expect(toActionState(new DomainError("conflict", "Last admin.")).message).toBe("Last admin.");
    const log = vi.fn();
    expect(toActionState(new Error("boom"), log).message).not.toContain("boom");
    expect(log).toHaveBeenCalled();
  });
});
