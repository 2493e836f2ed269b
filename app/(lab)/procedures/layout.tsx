import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

// Every procedure page needs procedure.read; pages that change things check more in their own layout.
// Loading boundaries sit in route groups below, so these checks finish before the response starts.
export default async function ProceduresLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/procedures");
  return children;
}
