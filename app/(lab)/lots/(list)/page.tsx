import type { Metadata } from "next";
import { z } from "zod";
import { ActionLink } from "@/components/ui/action-link";
import { Cell, EmptyState, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { TextLink } from "@/components/ui/text-link";
import { TextSearch } from "@/components/ui/text-search";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { listLots } from "@/db/lots";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { formatNumber } from "@/protocols";

export const metadata: Metadata = { title: "Lots" };

export default async function LotsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageAccess("/lots");
  const q = z.string().trim().max(100).optional().catch(undefined).parse((await searchParams).q);
  const lots = await listLots(getDb(), { q: q || undefined });
  return (
    <>
      <PageHeader
        title="Lots"
        lead="Cells received together from one supplier. The specimens drawn from a lot for testing are registered under it."
        actions={
          can(user.role, "specimen.manage") && (
            <ActionLink href="/lots/new">
              Register a lot
            </ActionLink>
          )
        }
      />
      <TextSearch label="Lot, supplier, maker or model" value={q} />
      <Table>
        <TableHead>
          <HeaderCell>Lot</HeaderCell>
          <HeaderCell>Cell</HeaderCell>
          <HeaderCell>Supplier</HeaderCell>
          <HeaderCell className="text-right">Cells received</HeaderCell>
          <HeaderCell className="text-right">Specimens registered</HeaderCell>
          <HeaderCell>Date received</HeaderCell>
        </TableHead>
        <tbody>
          {lots.map((l) => (
            <Row key={l.id}>
              <Cell>
                <TextLink href={`/lots/${l.id}`} className="font-medium">
                  {l.identifier}
                </TextLink>
              </Cell>
              <Cell>
                {l.specification.maker} {l.specification.model} <span className="font-mono text-xs text-ink-soft">{l.specification.designation}</span>
              </Cell>
              <Cell>{l.supplier}</Cell>
              <Cell className="text-right">{formatNumber(l.quantityReceived)} cells</Cell>
              <Cell className="text-right">{formatNumber(l.specimenCount)}</Cell>
              <Cell className="whitespace-nowrap">{l.receivedOn}</Cell>
            </Row>
          ))}
        </tbody>
      </Table>
      {lots.length === 0 && <EmptyState>No lots match.</EmptyState>}
    </>
  );
}
