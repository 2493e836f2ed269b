import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { getDb } from "@/db";
import { getCertificateByNumber } from "@/db/certificates";
import { requireAreaAccess } from "@/lib/auth/guards";
import { certificateNumberSchema } from "@/lib/certificate-list/certificate-number";

/** Outside the page's loading boundary, so an unknown number answers with a real 404. */
export default async function CertificateLayout({ children, params }: { children: ReactNode; params: Promise<{ number: string }> }) {
  await requireAreaAccess("/certificates/[number]");
  const number = certificateNumberSchema.safeParse((await params).number);
  if (!number.success || !(await getCertificateByNumber(getDb(), number.data))) notFound();
  return children;
}
