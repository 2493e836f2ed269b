import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { getDb } from "@/db";
import { getCertificateByNumber } from "@/db/certificates";
import { requirePagePermission } from "@/lib/auth/guards";
import { certificateNumberSchema } from "@/lib/certificate-list/certificate-number";

/** Outside the page's loading boundary, so an unknown number answers with a real 404. */
export default async function CertificateLayout({ children, params }: { children: ReactNode; params: Promise<{ number: string }> }) {
  await requirePagePermission("certificate.read");
  const number = certificateNumberSchema.safeParse((await params).number);
  if (!number.success || !(await getCertificateByNumber(getDb(), number.data))) notFound();
  return children;
}
