import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

export default async function CertificatesLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/certificates");
  return children;
}
