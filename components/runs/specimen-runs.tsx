import { DataTable, type DataColumn } from "@/components/ui/data-table";
import { TextLink } from "@/components/ui/text-link";
import type { Page } from "@/db/paginate";
import type { RunSort, RunSummary } from "@/db/runs";
import type { SortDirection } from "@/lib/lists/list-params";
import { RUN_STATUS_WORDS } from "@/lib/runs/run-status";

const COLUMNS: DataColumn<RunSummary, RunSort>[] = [
  { header: "Run", sort: "number", cell: (r) => <TextLink href={`/runs/${r.id}`} className="font-medium">{r.number}</TextLink> },
  {
    header: "Procedure",
    sort: "procedure",
    cell: (r) => (
      <>
        {r.procedure.code} v{r.procedure.number} <span className="text-ink-soft">{r.procedure.title}</span>
      </>
    ),
  },
  {
    header: "Status",
    sort: "status",
    cell: (r) => (
      <>
        <span aria-hidden="true">{RUN_STATUS_WORDS[r.status].mark} </span>
        {RUN_STATUS_WORDS[r.status].words}
        {r.abandoned && <span className="block text-ink-soft">{r.abandoned.reason}</span>}
      </>
    ),
  },
  { header: "Planned on", sort: "planned", firstDirection: "desc", className: "whitespace-nowrap", cell: (r) => r.createdAt.toISOString().slice(0, 10) },
];

/** Every run of one specimen, abandoned ones included with their reason, newest first, a page at a time. */
export function SpecimenRuns({
  runs,
  path,
  kept,
  sort,
}: {
  runs: Page<RunSummary>;
  /** The specimen page's own path, for the sort and page links. */
  path: string;
  kept: Record<string, string>;
  sort: { key: RunSort; direction: SortDirection };
}) {
  return (
    <section aria-labelledby="specimen-runs-heading" className="mt-8 max-w-4xl" data-testid="specimen-runs">
      <h2 id="specimen-runs-heading" className="mb-2 font-serif text-lg font-bold">
        Runs on this specimen
      </h2>
      {runs.total === 0 ? (
        <p className="text-sm text-ink-soft">No run has been planned on this specimen.</p>
      ) : (
        <DataTable rows={runs.rows} rowKey={(r) => r.id} columns={COLUMNS} path={path} kept={kept} sort={sort} page={runs} empty="No run has been planned on this specimen." noun={["run", "runs"]} />
      )}
    </section>
  );
}
