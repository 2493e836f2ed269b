import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function ManageSpecLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/specs/[id]/edit");
  return children;
}
