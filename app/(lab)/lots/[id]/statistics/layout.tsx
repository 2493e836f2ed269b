import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function LotStatisticsLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/lots/[id]/statistics");
  return children;
}
