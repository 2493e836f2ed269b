import type { Metadata } from "next";
import { z } from "zod";
import { StatusBadge } from "@/components/procedures/status-badge";
import { FilterBar, FilterInput } from "@/components/ui/filter-bar";
import { ActionLink } from "@/components/ui/action-link";
import { PageHeader } from "@/components/ui/page-header";
import { SelectField } from "@/components/ui/select-field";
import { Cell, EmptyState, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listProcedures } from "@/db/procedures";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "Procedures" };

const searchSchema = z.object({
  q: z.string().trim().max(100).optional().catch(undefined),
  status: z.enum(["draft", "in_review", "released", "withdrawn"]).optional().catch(undefined),
});

export default async function ProceduresPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageAccess("/procedures");
  const { q, status } = searchSchema.parse(await searchParams);
  const author = can(user.role, "procedure.author");
  const procedures = await listProcedures(getDb(), { q: q || undefined, status: author ? status : undefined, releasedOnly: !author });
  return (
    <>
      <PageHeader
        title="Procedures"
        lead={
          author
            ? "Typed step lists written from a clause of a standard. A version is released only after a second engineer approves it, and never changes afterwards."
            : "The released procedures the lab runs. They are read-only here; ask a quality engineer for changes."
        }
        actions={
          author && (
            <ActionLink href="/procedures/new">
              New procedure
            </ActionLink>
          )
        }
      />
      <FilterBar label="Filter procedures">
        <FilterInput label="Code, title or standard" name="q" defaultValue={q ?? ""} />
        {author && (
          <SelectField filter label="Newest version is" name="status" defaultValue={status ?? ""}>
            <option value="">any status</option>
            <option value="draft">a draft</option>
            <option value="in_review">in review</option>
            <option value="released">released</option>
            <option value="withdrawn">withdrawn</option>
          </SelectField>
        )}
      </FilterBar>
      <Table>
        <TableHead>
          <HeaderCell>Code</HeaderCell>
          <HeaderCell>Title</HeaderCell>
          <HeaderCell>Standard, clause</HeaderCell>
          <HeaderCell>Released version</HeaderCell>
          {author && <HeaderCell>Newest version</HeaderCell>}
        </TableHead>
        <tbody>
          {procedures.map((p) => (
            <Row key={p.id}>
              <Cell className="font-mono">{p.code}</Cell>
              <Cell>
                <TextLink href={`/procedures/${p.id}`} className="font-medium">
                  {p.title}
                </TextLink>
              </Cell>
              <Cell>
                {p.standard} {p.clause}
              </Cell>
              <Cell className="figures">{p.releasedNumber ? `version ${p.releasedNumber}` : "none yet"}</Cell>
              {author && (
                <Cell>
                  version {p.latestNumber} <StatusBadge status={p.latestStatus} />
                </Cell>
              )}
            </Row>
          ))}
        </tbody>
      </Table>
      {procedures.length === 0 && <EmptyState>No procedures match.</EmptyState>}
    </>
  );
}
