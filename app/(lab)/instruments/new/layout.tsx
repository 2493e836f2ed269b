import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function ManageInstrumentLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/instruments/new");
  return children;
}
