import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

// Every run page needs run.read; pages that change a run check run.operate in their own layout.
export default async function RunsLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/runs");
  return children;
}
