import type { Permission } from "@/lib/auth/permissions";

/** The workbench's sections; each is shown to a role only if the role holds its permission. */
export const NAV_ITEMS: readonly { href: string; label: string; permission: Permission }[] = [
  { href: "/", label: "Home", permission: "workbench.enter" },
  { href: "/procedures", label: "Procedures", permission: "procedure.read" },
  { href: "/specs", label: "Cell specifications", permission: "spec.read" },
  { href: "/runs", label: "Runs", permission: "run.read" },
  { href: "/lots", label: "Lots", permission: "run.read" },
  { href: "/specimens", label: "Specimens", permission: "run.read" },
  { href: "/compare", label: "Compare discharges", permission: "run.read" },
  { href: "/instruments", label: "Instruments", permission: "run.read" },
  { href: "/certificates", label: "Certificates", permission: "certificate.read" },
  { href: "/audit", label: "Audit trail", permission: "audit.read" },
  { href: "/admin/users", label: "Users", permission: "user.manage" },
  { href: "/admin/mail", label: "E-mail", permission: "mail.read" },
  { href: "/admin/signing-key", label: "Signing key", permission: "signing-key.manage" },
  { href: "/admin/integrity", label: "Integrity", permission: "lab.manage" },
  { href: "/admin/cycler-tokens", label: "Cycler tokens", permission: "cycler-token.manage" },
];
