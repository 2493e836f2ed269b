import type { ReactNode } from "react";
import { requirePagePermission } from "@/lib/auth/guards";

export default async function CertificatesLayout({ children }: { children: ReactNode }) {
  await requirePagePermission("certificate.read");
  return children;
}
