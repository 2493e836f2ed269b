import type { ReactNode } from "react";
import { requirePagePermission } from "@/lib/auth/guards";

export default async function SpecsLayout({ children }: { children: ReactNode }) {
  await requirePagePermission("spec.read");
  return children;
}
