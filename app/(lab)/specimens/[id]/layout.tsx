import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { z } from "zod";
import { getDb } from "@/db";
import { getSpecimen } from "@/db/specimens";
import { requireAreaAccess } from "@/lib/auth/guards";

// An unknown specimen answers 404 before any loading boundary below starts the response with 200.
export default async function SpecimenLayout({ children, params }: { children: ReactNode; params: Promise<{ id: string }> }) {
  await requireAreaAccess("/specimens/[id]");
  const id = z.uuid().safeParse((await params).id);
  if (!id.success || !(await getSpecimen(getDb(), id.data))) notFound();
  return children;
}
