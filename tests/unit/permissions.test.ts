import { describe, expect, it } from "vitest";
import { can, isRole, PERMISSIONS, ROLE_PERMISSIONS, ROLES, type Permission, type Role } from "@/lib/auth/permissions";

// docs/design.md §2, written out as the expected grant for every role × permission pair.
const GRANTED: Record<Permission, Role[]> = {
  "workbench.enter": ["admin", "engineer", "operator", "auditor"],
  "user.manage": ["admin"],
  "lab.manage": ["admin"],
  "instrument.manage": ["admin"],
  "signing-key.manage": ["admin"],
  "audit.read": ["admin", "auditor"],
  "procedure.read": ["admin", "engineer", "operator", "auditor"],
  "procedure.author": ["engineer"],
  "procedure.release": ["engineer"],
  "spec.read": ["admin", "engineer", "operator", "auditor"],
  "spec.manage": ["engineer"],
  "specimen.manage": ["engineer", "operator"],
  "lot.sample": ["engineer"],
  "run.read": ["admin", "engineer", "operator", "auditor"],
  "run.operate": ["operator"],
  "run.review": ["engineer"],
  "certificate.read": ["admin", "engineer", "auditor"],
  "certificate.sign": ["engineer"],
  "mail.read": ["admin"],
  "cycler-token.manage": ["admin"],
};

describe("role → permission map", () => {
  const cases = PERMISSIONS.flatMap((p) => ROLES.map((r) => [r, p, GRANTED[p].includes(r)] as const));
  it.each(cases)("%s may %s: %s", (role, permission, expected) => {
    expect(can(role, permission)).toBe(expected);
  });

  it("grants nothing that is not a declared permission", () => {
    for (const role of ROLES) {
      for (const p of ROLE_PERMISSIONS[role]) expect(PERMISSIONS).toContain(p);
    }
  });

  it("never lets an operator review or sign, and never lets an auditor change anything", () => {
    expect(can("operator", "run.review")).toBe(false);
    expect(can("operator", "certificate.sign")).toBe(false);
    const writes = PERMISSIONS.filter((p) => /\.(manage|author|release|operate|review|sign)$/.test(p));
    for (const p of writes) expect(can("auditor", p)).toBe(false);
  });

  it("recognises roles and rejects anything else", () => {
    expect(isRole("engineer")).toBe(true);
    expect(isRole("superuser")).toBe(false);
    expect(isRole(undefined)).toBe(false);
  });
});
