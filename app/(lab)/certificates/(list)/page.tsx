import type { Metadata } from "next";
import { CertificateStatusWords } from "@/components/certificates/certificate-status";
import { VerdictWords } from "@/components/certificates/verdict-words";
import { FilterBar, FilterInput } from "@/components/ui/filter-bar";
import { DataTable, type DataColumn } from "@/components/ui/data-table";
import { PageHeader } from "@/components/ui/page-header";
import { SelectField } from "@/components/ui/select-field";
import { PlainLink, TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listCellSpecifications } from "@/db/cell-specifications";
import { CERTIFICATE_SORTS, listCertificatesPage, type CertificateSort, type CertificateView } from "@/db/certificates";
import { listLots } from "@/db/lots";
import { requirePageAccess } from "@/lib/auth/guards";
import { parseCertificateFilter, toCertificateQuery } from "@/lib/certificate-list/certificate-filter";
import { formatDateTime } from "@/lib/format-date-time";
import { keptParams, PAGE_SIZE, parseListParams } from "@/lib/lists/list-params";

export const metadata: Metadata = { title: "Certificates" };


const VERDICTS = ["conforms", "does not conform", "conditional pass", "conditional fail", "not decided"];

const COLUMNS: DataColumn<CertificateView, CertificateSort>[] = [
  {
    header: "Certificate",
    sort: "number",
    firstDirection: "desc",
    cell: (c) => (
      <>
        <TextLink href={`/certificates/${c.number}`} className="font-mono font-medium">
          {c.number}
        </TextLink>
        {c.replacesNumber && <span className="block text-xs text-ink-soft">replaces {c.replacesNumber}</span>}
      </>
    ),
  },
  { header: "State", cell: (c) => <CertificateStatusWords status={c.status} /> },
  { header: "Statement of conformity", cell: (c) => <VerdictWords verdict={c.verdict} /> },
  {
    header: "Specimen or lot",
    sort: "subject",
    cell: (c) => (
      <>
        {c.specimenIdentifier ?? c.lotIdentifier}
        {c.runNumber && <span className="block text-xs text-ink-soft">run {c.runNumber}</span>}
      </>
    ),
  },
  { header: "Cell", sort: "cell", cell: (c) => c.cellLabel },
  {
    header: "Issued",
    sort: "issued",
    firstDirection: "desc",
    className: "whitespace-nowrap",
    cell: (c) => (
      <>
        {formatDateTime(c.issuedAt)}
        <span className="block text-xs text-ink-soft">{c.issuedByName}</span>
      </>
    ),
  },
  { header: "PDF", cell: (c) => <PlainLink href={`/api/certificates/${c.number}/pdf`}>Download</PlainLink> },
];

export default async function CertificatesPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  await requirePageAccess("/certificates");
  const raw = await searchParams;
  const filter = parseCertificateFilter(raw);
  const db = getDb();
  const list = parseListParams(raw, { sorts: CERTIFICATE_SORTS, defaultSort: "issued", defaultDirection: "desc" });
  const [certificates, lots, specs] = await Promise.all([
    listCertificatesPage(db, toCertificateQuery(filter), { ...list, pageSize: PAGE_SIZE }),
    listLots(db),
    listCellSpecifications(db),
  ]);
  const kept = keptParams(raw);
  const filtered = Object.values(filter).some(Boolean);
  return (
    <>
      <PageHeader
        title="Certificates"
        lead="Signed reports of accepted runs. Each states its own number on every page and can be checked by anyone on its public page."
      />
      <FilterBar label="Filter certificates" keep={{ sort: kept.sort, dir: kept.dir }} clear={filtered ? { href: "/certificates", words: "Clear the filter" } : undefined}>
        <SelectField
          filter
          label="Lot"
          name="lot"
          defaultValue={filter.lot ?? ""}
          options={[{ value: "", label: "any lot" }, ...lots.map((l) => ({ value: l.id, label: l.identifier }))]}
        />
        <SelectField
          filter
          label="Cell specification"
          name="spec"
          defaultValue={filter.spec ?? ""}
          options={[{ value: "", label: "any cell" }, ...specs.map((s) => ({ value: s.id, label: `${s.maker} ${s.model}` }))]}
        />
        <FilterInput type="date" label="Issued from" name="from" defaultValue={filter.from ?? ""} />
        <FilterInput type="date" label="Issued to" name="to" defaultValue={filter.to ?? ""} />
        <SelectField
          filter
          label="Statement of conformity"
          name="verdict"
          defaultValue={filter.verdict ?? ""}
          options={[{ value: "", label: "any" }, ...VERDICTS.map((v) => ({ value: v, label: v }))]}
        />
      </FilterBar>
      <DataTable
        rows={certificates.rows}
        rowKey={(c) => c.id}
        columns={COLUMNS}
        path="/certificates"
        kept={kept}
        sort={{ key: list.sort, direction: list.direction }}
        page={certificates}
        empty={filtered ? "No certificate matches this filter." : "No certificate has been issued yet."}
        noun={["certificate", "certificates"]}
        testId="certificate-list"
      />
    </>
  );
}
