import type { Metadata } from "next";
import { z } from "zod";
import { ActionLink } from "@/components/ui/action-link";
import { DataTable, type DataColumn } from "@/components/ui/data-table";
import { FilterBar, FilterCheck } from "@/components/ui/filter-bar";
import { PageHeader } from "@/components/ui/page-header";
import { SelectField } from "@/components/ui/select-field";
import { TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listRunsPage, RUN_SORTS, type RunSort, type RunSummary } from "@/db/runs";
import type { RunStatus } from "@/db/schema";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { keptParams, PAGE_SIZE, parseListParams } from "@/lib/lists/list-params";
import { RUN_STATUS_WORDS } from "@/lib/runs/run-status";

export const metadata: Metadata = { title: "Runs" };

const STATUSES = Object.keys(RUN_STATUS_WORDS) as RunStatus[];
const filterSchema = z.object({
  status: z.enum(STATUSES as [RunStatus, ...RunStatus[]]).optional().catch(undefined),
  mine: z.literal("1").optional().catch(undefined),
});

const COLUMNS: DataColumn<RunSummary, RunSort>[] = [
  { header: "Run", sort: "number", className: "whitespace-nowrap", cell: (r) => <TextLink href={`/runs/${r.id}`} className="font-medium">{r.number}</TextLink> },
  {
    header: "Procedure",
    sort: "procedure",
    cell: (r) => (
      <>
        {r.procedure.code} v{r.procedure.number} <span className="text-ink-soft">{r.procedure.title}</span>
      </>
    ),
  },
  { header: "Specimen", sort: "specimen", className: "font-mono", cell: (r) => r.specimen.identifier },
  { header: "Operator", sort: "operator", cell: (r) => r.operator.name },
  {
    header: "Status",
    sort: "status",
    cell: (r) => (
      <>
        <span aria-hidden="true">{RUN_STATUS_WORDS[r.status].mark} </span>
        {RUN_STATUS_WORDS[r.status].words}
      </>
    ),
  },
  { header: "Planned on", sort: "planned", firstDirection: "desc", className: "whitespace-nowrap", cell: (r) => r.createdAt.toISOString().slice(0, 10) },
];

export default async function RunsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageAccess("/runs");
  const raw = await searchParams;
  const filter = filterSchema.parse(raw);
  const list = parseListParams(raw, { sorts: RUN_SORTS, defaultSort: "planned", defaultDirection: "desc" });
  const runs = await listRunsPage(getDb(), { status: filter.status, operatorId: filter.mine ? user.id : undefined }, { ...list, pageSize: PAGE_SIZE });
  const kept = keptParams(raw);
  return (
    <>
      <PageHeader
        title="Runs"
        lead="Each run is one procedure version carried out on one specimen, with its set-points frozen when it was started."
        actions={can(user.role, "run.operate") && <ActionLink href="/runs/new">Start a run</ActionLink>}
      />
      <FilterBar keep={{ sort: kept.sort, dir: kept.dir }}>
        <SelectField
          filter
          label="Status"
          name="status"
          defaultValue={filter.status ?? ""}
          options={[{ value: "", label: "any" }, ...STATUSES.map((s) => ({ value: s, label: RUN_STATUS_WORDS[s].words }))]}
        />
        {can(user.role, "run.operate") && (
          <FilterCheck label="Only runs I operated" name="mine" checked={filter.mine === "1"} />
        )}
      </FilterBar>
      <DataTable
        rows={runs.rows}
        rowKey={(r) => r.id}
        columns={COLUMNS}
        path="/runs"
        kept={kept}
        sort={{ key: list.sort, direction: list.direction }}
        page={runs}
        empty="No runs match."
        noun={["run", "runs"]}
        testId="run-list"
      />
    </>
  );
}
