import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function SpecimenRateCapabilityLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/specimens/[id]/rate-capability");
  return children;
}
