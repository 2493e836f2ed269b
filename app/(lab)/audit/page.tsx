import type { Metadata } from "next";
import { FilterBar, FilterInput } from "@/components/ui/filter-bar";
import { PageHeader } from "@/components/ui/page-header";
import { SelectField } from "@/components/ui/select-field";
import { Cell, EmptyState, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { PlainLink, TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listAuditActors, listAuditEvents } from "@/db/audit";
import { requirePageAccess } from "@/lib/auth/guards";
import { AUDIT_ACTION_LABELS, AUDIT_RECORD_TYPES, describeAuditAction, describeAuditRecord, summariseAuditChange } from "@/lib/audit-labels";
import { auditTrailSearchSchema, toAuditFilter, toAuditSearchParams } from "@/lib/audit-trail-filter";

export const metadata: Metadata = { title: "Audit trail" };

const PAGE_SIZE = 50;

const AREAS: [string, string][] = [
  ["auth.", "sign-in and sign-out"],
  ["user.", "user changes"],
  ["security.", "refused requests"],
  ["signature.", "refused signatures"],
  ["procedure.", "procedures"],
  ["spec.", "cell specifications"],
  ["instrument.", "instruments"],
  ["lot.", "lots"],
  ["specimen.", "specimens"],
  ["run.", "runs"],
  ["certificate.", "certificates"],
];

export default async function AuditPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  await requirePageAccess("/audit");
  const search = auditTrailSearchSchema.parse(await searchParams);
  const [events, actors] = await Promise.all([listAuditEvents(getDb(), { ...toAuditFilter(search), limit: PAGE_SIZE }), listAuditActors(getDb())]);
  const last = events.at(-1);
  return (
    <>
      <PageHeader
        title="Audit trail"
        lead="Every sign-in, change and refusal, newest first. The database accepts new entries only: nothing here can be edited or removed."
        actions={
          <PlainLink href={`/api/audit/trail.csv?${toAuditSearchParams(search)}`} download className="text-sm">
            Download these entries as CSV
          </PlainLink>
        }
      />
      <FilterBar grid label="Filter the audit trail" clear={{ href: "/audit", words: "Clear filters" }}>
        <SelectField filter label="What happened" name="action" defaultValue={search.action ?? ""}>
          <option value="">everything</option>
          {AREAS.map(([code, words]) => (
            <option key={code} value={code}>
              {words}
            </option>
          ))}
          {Object.entries(AUDIT_ACTION_LABELS).map(([code, label]) => (
            <option key={code} value={code}>
              only: {label}
            </option>
          ))}
        </SelectField>
        <SelectField filter label="Who" name="person" defaultValue={search.person ?? ""}>
          <option value="">anyone</option>
          {actors.map((a) => (
            <option key={a.id} value={a.id}>
              {a.label}
            </option>
          ))}
        </SelectField>
        <SelectField filter label="Kind of record" name="kind" defaultValue={search.kind ?? ""}>
          <option value="">any</option>
          {Object.entries(AUDIT_RECORD_TYPES).map(([code, words]) => (
            <option key={code} value={code}>
              {words}
            </option>
          ))}
        </SelectField>
        <FilterInput label="Record name contains" name="record" defaultValue={search.record ?? ""} placeholder="e.g. R-00012, TPL-RC20, KV48" />
        <FilterInput type="date" label="From (UTC day)" name="from" defaultValue={search.from ?? ""} />
        <FilterInput type="date" label="To (UTC day, included)" name="to" defaultValue={search.to ?? ""} />
      </FilterBar>
      <Table data-testid="audit-trail">
        <TableHead>
          <HeaderCell>When (UTC)</HeaderCell>
          <HeaderCell>Who</HeaderCell>
          <HeaderCell>What happened</HeaderCell>
          <HeaderCell>What changed (was → now)</HeaderCell>
        </TableHead>
        <tbody>
          {events.map((e) => (
            <Row key={e.id} top>
              <Cell className="figures">
                <span className="whitespace-nowrap">{e.at.toISOString().slice(0, 10)}</span>{" "}
                <span className="whitespace-nowrap">{e.at.toISOString().slice(11, 19)}</span>
              </Cell>
              <Cell className="min-w-[9rem] [overflow-wrap:break-word]">
                {e.actorLabel}
                {e.address && <span className="block text-xs text-ink-soft">from {e.address}</span>}
              </Cell>
              <Cell className="min-w-[10rem]">
                {describeAuditAction(e.action)}
                {e.entityType && <span className="block text-xs text-ink-soft">{describeAuditRecord(e.entityType, e.entityLabel)}</span>}
              </Cell>
              <Cell className="min-w-[12rem] text-xs [overflow-wrap:anywhere]">
                <ChangeLines lines={summariseAuditChange(e.before, e.after, e.detail)} />
              </Cell>
            </Row>
          ))}
        </tbody>
      </Table>
      {events.length === 0 && <EmptyState>No entries match.</EmptyState>}
      {events.length === PAGE_SIZE && last && (
        <p className="mt-4">
          <TextLink href={`/audit?${toAuditSearchParams(search, { before: last.id })}`}>
            Older entries
          </TextLink>
        </p>
      )}
    </>
  );
}

function ChangeLines({ lines }: { lines: string[] }) {
  if (lines.length === 0) return <>—</>;
  return (
    <ul>
      {lines.map((l) => (
        <li key={l}>{l}</li>
      ))}
    </ul>
  );
}
