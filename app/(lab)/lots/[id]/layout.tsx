import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { z } from "zod";
import { getDb } from "@/db";
import { getLot } from "@/db/lots";
import { requireAreaAccess } from "@/lib/auth/guards";

// An unknown lot answers 404 before any loading boundary below starts the response with 200.
export default async function LotLayout({ children, params }: { children: ReactNode; params: Promise<{ id: string }> }) {
  await requireAreaAccess("/lots/[id]");
  const id = z.uuid().safeParse((await params).id);
  if (!id.success || !(await getLot(getDb(), id.data))) notFound();
  return children;
}
