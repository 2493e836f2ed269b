import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { z } from "zod";
import { VersionComparison } from "@/components/procedures/version-comparison";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { getProcedureVersion } from "@/db/procedures";
import { requirePageAccess } from "@/lib/auth/guards";
import { canSeeVersion } from "@/lib/procedures/read-access";

export const metadata: Metadata = { title: "Compare versions" };

const querySchema = z.object({ a: z.coerce.number<string>().int().min(1), b: z.coerce.number<string>().int().min(1) });

export default async function ComparePage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<Record<string, string | undefined>> }) {
  const user = await requirePageAccess("/procedures/[id]/compare");
  const id = z.uuid().safeParse((await params).id);
  const q = querySchema.safeParse(await searchParams);
  if (!id.success) notFound();
  if (!q.success) {
    return <p>Choose two versions to compare on the <TextLink href={`/procedures/${id.data}`}>procedure page</TextLink>.</p>;
  }
  const [a, b] = await Promise.all([getProcedureVersion(getDb(), id.data, q.data.a), getProcedureVersion(getDb(), id.data, q.data.b)]);
  if (!a || !b || !canSeeVersion(user, a.status) || !canSeeVersion(user, b.status)) notFound();
  return (
    <>
      <PageHeader
        title={`${a.code}: version ${a.number} beside version ${b.number}`}
        actions={<TextLink href={`/procedures/${a.procedureId}`} className="text-sm">All versions</TextLink>}
      />
      <VersionComparison before={a} after={b} />
    </>
  );
}
