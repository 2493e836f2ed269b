import type { ReactNode } from "react";
import { requirePagePermission } from "@/lib/auth/guards";

export default async function ManageSpecimenLayout({ children }: { children: ReactNode }) {
  await requirePagePermission("specimen.manage");
  return children;
}
