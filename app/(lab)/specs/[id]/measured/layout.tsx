import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function SpecMeasuredLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/specs/[id]/measured");
  return children;
}
