import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

// Checked here, outside this section's loading boundary, so a refusal is a real 403.
export default async function AdminLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/admin");
  return children;
}
