import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { z } from "zod";
import { getDb } from "@/db";
import { getCellSpecification } from "@/db/cell-specifications";
import { requireAreaAccess } from "@/lib/auth/guards";

// An unknown specification answers 404 before any loading boundary below starts the response with 200.
export default async function SpecLayout({ children, params }: { children: ReactNode; params: Promise<{ id: string }> }) {
  await requireAreaAccess("/specs/[id]");
  const id = z.uuid().safeParse((await params).id);
  if (!id.success || !(await getCellSpecification(getDb(), id.data))) notFound();
  return children;
}
