import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function ManageSpecimenLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/specimens/new");
  return children;
}
