import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";
import { loadVersionForEdit } from "./load-version";

// Checked here, outside this page's loading boundary, so a refusal is a real 403 and a missing
// version a real 404.
export default async function EditVersionLayout({ children, params }: { children: ReactNode; params: Promise<{ id: string; n: string }> }) {
  await requireAreaAccess("/procedures/[id]/versions/[n]/edit");
  const { id, n } = await params;
  if (!(await loadVersionForEdit(id, n))) notFound();
  return children;
}
