import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function LotsLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/lots");
  return children;
}
