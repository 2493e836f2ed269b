import type { Metadata } from "next";
import { z } from "zod";
import { ActionLink } from "@/components/ui/action-link";
import { Cell, EmptyState, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { TextLink } from "@/components/ui/text-link";
import { TextSearch } from "@/components/ui/text-search";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { listCellSpecifications } from "@/db/cell-specifications";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { formatNumber } from "@/protocols";

export const metadata: Metadata = { title: "Cell specifications" };

export default async function SpecsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageAccess("/specs");
  const q = z.string().trim().max(100).optional().catch(undefined).parse((await searchParams).q);
  const specs = await listCellSpecifications(getDb(), { q: q || undefined });
  return (
    <>
      <PageHeader
        title="Cell specifications"
        lead="Datasheet values of each cell type the lab tests. Procedures resolve their currents and voltages from these."
        actions={
          can(user.role, "spec.manage") && (
            <ActionLink href="/specs/new">
              New specification
            </ActionLink>
          )
        }
      />
      <TextSearch label="Maker, model or designation" value={q} />
      <Table>
        <TableHead>
          <HeaderCell>Maker and model</HeaderCell>
          <HeaderCell>Designation</HeaderCell>
          <HeaderCell>Chemistry</HeaderCell>
          <HeaderCell className="text-right">Rated capacity</HeaderCell>
          <HeaderCell className="text-right">Charge voltage</HeaderCell>
          <HeaderCell className="text-right">End-of-discharge</HeaderCell>
          <HeaderCell className="text-right">Max. discharge</HeaderCell>
          <HeaderCell>Datasheet</HeaderCell>
        </TableHead>
        <tbody>
          {specs.map((s) => (
            <Row key={s.id}>
              <Cell>
                <TextLink href={`/specs/${s.id}`} className="font-medium">
                  {s.maker} {s.model}
                </TextLink>
              </Cell>
              <Cell className="font-mono">{s.designation}</Cell>
              <Cell>{s.data.chemistry.label}</Cell>
              <Cell className="text-right">{formatNumber(s.data.ratedCapacityMah)} mAh</Cell>
              <Cell className="text-right">{formatNumber(s.data.chargeVoltageV, { minDecimals: 2 })} V</Cell>
              <Cell className="text-right">{formatNumber(s.data.endOfDischargeVoltageV, { minDecimals: 2 })} V</Cell>
              <Cell className="text-right">{formatNumber(s.data.maxContinuousDischargeCurrentA)} A</Cell>
              <Cell>{s.datasheet ? "PDF on file" : "none"}</Cell>
            </Row>
          ))}
        </tbody>
      </Table>
      {specs.length === 0 && <EmptyState>No specifications match.</EmptyState>}
    </>
  );
}
