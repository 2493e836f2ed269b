import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

// Checked here, outside this page's loading boundary, so a refusal is a real 403.
export default async function ReleaseVersionLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/procedures/[id]/versions/[n]/release");
  return children;
}
