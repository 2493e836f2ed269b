import type { ReactNode } from "react";
import { requirePagePermission } from "@/lib/auth/guards";

export default async function SpecimenRateCapabilityLayout({ children }: { children: ReactNode }) {
  await requirePagePermission("run.read");
  return children;
}
