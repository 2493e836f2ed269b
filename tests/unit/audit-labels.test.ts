import { describe, expect, it } from "vitest";
import { describeAuditAction, summariseAuditChange } from "@/lib/audit-labels";

describe("summariseAuditChange", () => {
  it("lists only the fields that changed", () => {
    const lines = summariseAuditChange(
      { email: "a@x.example", role: "operator", active: true },
      { email: "a@x.example", role: "operator", active: false },
      { endedSessions: 2 },
    );
    expect(lines).toEqual(["active: yes → no", "endedSessions: 2"]);
  });

  it("lists every value of a new record", () => {
    expect(summariseAuditChange(null, { role: "auditor", active: true }, null)).toEqual(["role: auditor", "active: yes"]);
  });

  it("says nothing when there is nothing to say", () => {
    expect(summariseAuditChange(null, null, null)).toEqual([]);
  });

  it("names known actions in words and leaves unknown ones as their code", () => {
    expect(describeAuditAction("auth.sign-in-failed")).toBe("failed sign-in");
    expect(describeAuditAction("run.something-new")).toBe("run.something-new");
  });
});
