import type { ReactNode } from "react";
import { requirePagePermission } from "@/lib/auth/guards";

export default async function ManageSpecLayout({ children }: { children: ReactNode }) {
  await requirePagePermission("spec.manage");
  return children;
}
