import type { Role } from "@/db/schema";

export type { Role };
export const ROLES = ["admin", "engineer", "operator", "auditor"] as const satisfies readonly Role[];

/**
 * Every action the server authorises, as `resource.verb`. Pages, route handlers and server actions
 * name one of these; the UI may hide what a role cannot do, but the server always checks.
 */
export const PERMISSIONS = [
  "workbench.enter",
  "user.manage",
  "lab.manage",
  "instrument.manage",
  "signing-key.manage",
  "audit.read",
  "procedure.read",
  "procedure.author",
  "procedure.release",
  "spec.read",
  "spec.manage",
  "specimen.manage",
  "lot.sample",
  "run.read",
  "run.operate",
  "run.review",
  "certificate.read",
  "certificate.sign",
  "mail.read",
  "cycler-token.manage",
] as const;
export type Permission = (typeof PERMISSIONS)[number];

/** docs/design.md §2: who may do what. Data, not code paths, so one table answers "can X do Y". */
export const ROLE_PERMISSIONS: Record<Role, readonly Permission[]> = {
  admin: [
    "workbench.enter",
    "user.manage",
    "lab.manage",
    "instrument.manage",
    "signing-key.manage",
    "audit.read",
    "procedure.read",
    "spec.read",
    "run.read",
    "certificate.read",
    "mail.read",
    "cycler-token.manage",
  ],
  engineer: [
    "workbench.enter",
    "procedure.read",
    "procedure.author",
    "procedure.release",
    "spec.read",
    "spec.manage",
    "specimen.manage",
    "lot.sample",
    "run.read",
    "run.review",
    "certificate.read",
    "certificate.sign",
  ],
  operator: ["workbench.enter", "procedure.read", "spec.read", "specimen.manage", "run.read", "run.operate"],
  auditor: ["workbench.enter", "audit.read", "procedure.read", "spec.read", "run.read", "certificate.read"],
};

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}

export function can(role: Role, permission: Permission): boolean {
  return ROLE_PERMISSIONS[role].includes(permission);
}

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Administrator",
  engineer: "Quality engineer",
  operator: "Operator",
  auditor: "Auditor",
};
