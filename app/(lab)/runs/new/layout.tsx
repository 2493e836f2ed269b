import type { ReactNode } from "react";
import { requirePagePermission } from "@/lib/auth/guards";

// Outside the loading boundary, so a refusal answers with a real 403.
export default async function StartRunLayout({ children }: { children: ReactNode }) {
  await requirePagePermission("run.operate");
  return children;
}
