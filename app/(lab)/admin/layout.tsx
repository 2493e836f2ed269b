import type { ReactNode } from "react";
import { requirePagePermission } from "@/lib/auth/guards";

// Checked here, outside this section's loading boundary, so a refusal is a real 403.
export default async function AdminLayout({ children }: { children: ReactNode }) {
  await requirePagePermission("user.manage");
  return children;
}
