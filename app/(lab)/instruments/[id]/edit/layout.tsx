import type { ReactNode } from "react";
import { requirePagePermission } from "@/lib/auth/guards";

export default async function ManageInstrumentLayout({ children }: { children: ReactNode }) {
  await requirePagePermission("instrument.manage");
  return children;
}
