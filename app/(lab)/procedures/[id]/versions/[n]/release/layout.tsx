import type { ReactNode } from "react";
import { requirePagePermission } from "@/lib/auth/guards";

// Checked here, outside this page's loading boundary, so a refusal is a real 403.
export default async function ReleaseVersionLayout({ children }: { children: ReactNode }) {
  await requirePagePermission("procedure.release");
  return children;
}
