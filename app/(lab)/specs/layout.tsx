import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function SpecsLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/specs");
  return children;
}
