import type { Permission } from "@/lib/auth/permissions";

/** The workbench's sections; each is shown to a role only if the role holds its permission. */
export const NAV_ITEMS: readonly { href: string; label: string; permission: Permission }[] = [
  { href: "/", label: "Home", permission: "workbench.enter" },
  { href: "/procedures", label: "Procedures", permission: "procedure.read" },
  { href: "/specs", label: "Cell specifications", permission: "spec.read" },
  { href: "/audit", label: "Audit trail", permission: "audit.read" },
  { href: "/admin/users", label: "Users", permission: "user.manage" },
];
