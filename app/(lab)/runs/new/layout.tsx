import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

// Outside the loading boundary, so a refusal answers with a real 403.
export default async function StartRunLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/runs/new");
  return children;
}
