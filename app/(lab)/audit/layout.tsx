import type { ReactNode } from "react";
import { requirePagePermission } from "@/lib/auth/guards";

export default async function AuditLayout({ children }: { children: ReactNode }) {
  await requirePagePermission("audit.read");
  return children;
}
