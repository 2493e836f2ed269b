import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function SpecimensLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/specimens");
  return children;
}
