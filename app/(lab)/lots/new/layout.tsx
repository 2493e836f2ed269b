import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function ManageLotLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/lots/new");
  return children;
}
