import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function AuditLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/audit");
  return children;
}
