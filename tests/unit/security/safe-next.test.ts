import { describe, expect, it } from "vitest";
import { safeNextPath } from "@/lib/auth/safe-next";

// Issue 11 row 1: `/sign-in?next=%2F%5Cevil.example` sent people to http://evil.example/ after sign-in.
describe("safeNextPath (where sign-in leads)", () => {
  it.each([
    ["/\\evil.example", "/"],
    ["/\\\\evil.example", "/"],
    ["//evil.example", "/"],
    ["/\t/evil.example", "/"],
    ["/%0a/evil.example", "/%0a/evil.example"],
    ["https://evil.example/", "/"],
    ["javascript:alert(1)", "/"],
    ["evil.example", "/"],
    ["", "/"],
    [null, "/"],
  ])("%j → %j", (next, expected) => {
    expect(safeNextPath(next)).toBe(expected);
  });

  it("keeps a path on this site with its query", () => {
    expect(safeNextPath("/runs/abc?tab=log")).toBe("/runs/abc?tab=log");
    expect(safeNextPath("/")).toBe("/");
  });
});
