import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function InstrumentsLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/instruments");
  return children;
}
