import { describe, expect, it } from "vitest";
import { describeAuditAction, describeAuditRecord, summariseAuditChange } from "@/lib/audit-labels";

describe("summariseAuditChange", () => {
  it("lists only the fields that changed", () => {
    const lines = summariseAuditChange(
      { email: "a@x.example", role: "operator", active: true },
      { email: "a@x.example", role: "operator", active: false },
      { endedSessions: 2 },
    );
    expect(lines).toEqual(["active: yes → no", "sessions ended: 2"]);
  });

  it("lists every value of a new record", () => {
    expect(summariseAuditChange(null, { role: "auditor", active: true }, null)).toEqual(["role: auditor", "active: yes"]);
  });

  it("shows states, lists and nested values in words, never as JSON, state codes or ids", () => {
    const lines = summariseAuditChange(
      { status: "in_review" },
      { status: "released" },
      { code: "TPL-RC20", version: 2, readings: [{ valueC: 23.4 }], record: "0b7f5a4e-2c1d-4e8f-9a6b-3c2d1e0f9a8b" },
    );
    expect(lines).toEqual(["status: in review → released", "code: TPL-RC20", "version: 2", "readings: °C 23.4", "record: (a record)"]);
    expect(lines.join(" ")).not.toMatch(/[{}"]|in_review|0b7f5a4e/);
  });

  it("says caution codes in words", () => {
    expect(summariseAuditChange(null, null, { acknowledgedCautionCodes: ["discharge-current-above-rating/discharge-max/current"] })).toEqual([
      "cautions acknowledged: The step “discharge-max”, current: set above the cell's maximum continuous discharge current",
    ]);
  });

  it("names records by kind and name", () => {
    expect(describeAuditRecord("procedure-version", "TPL-RC20 version 2")).toBe("procedure TPL-RC20 version 2");
    expect(describeAuditRecord("run", null)).toBe("a run (name not known)");
    expect(describeAuditRecord(null, null)).toBe("—");
  });

  it("says nothing when there is nothing to say", () => {
    expect(summariseAuditChange(null, null, null)).toEqual([]);
  });

  it("names known actions in words and leaves unknown ones as their code", () => {
    expect(describeAuditAction("auth.sign-in-failed")).toBe("failed sign-in");
    expect(describeAuditAction("run.something-new")).toBe("run: something new");
  });
});
