import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function CompareLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/compare");
  return children;
}
