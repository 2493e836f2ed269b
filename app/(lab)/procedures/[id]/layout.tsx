import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { z } from "zod";
import { getDb } from "@/db";
import { listProcedureVersions } from "@/db/procedures";
import { requireAreaAccess } from "@/lib/auth/guards";
import { canSeeVersion } from "@/lib/procedures/read-access";

// An unknown procedure answers 404 before any loading boundary below starts the response with 200.
export default async function ProcedureLayout({ children, params }: { children: ReactNode; params: Promise<{ id: string }> }) {
  const user = await requireAreaAccess("/procedures/[id]");
  const id = z.uuid().safeParse((await params).id);
  if (!id.success) notFound();
  const versions = await listProcedureVersions(getDb(), id.data);
  if (!versions.some((v) => canSeeVersion(user, v.status))) notFound();
  return children;
}
