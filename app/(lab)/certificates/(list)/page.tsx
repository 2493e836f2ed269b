import type { Metadata } from "next";
import Link from "next/link";
import { CertificateStatusWords } from "@/components/certificates/certificate-status";
import { VerdictWords } from "@/components/certificates/verdict-words";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { listCellSpecifications } from "@/db/cell-specifications";
import { listCertificates } from "@/db/certificates";
import { listLots } from "@/db/lots";
import { requirePageAccess } from "@/lib/auth/guards";
import { parseCertificateFilter, toCertificateQuery } from "@/lib/certificate-list/certificate-filter";
import { formatDateTime } from "@/lib/format-date-time";

export const metadata: Metadata = { title: "Certificates" };

const selectClass = "rounded border border-rule bg-white px-2 py-1.5 text-sm";

export default async function CertificatesPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  await requirePageAccess("/certificates");
  const filter = parseCertificateFilter(await searchParams);
  const db = getDb();
  const [certificates, lots, specs] = await Promise.all([listCertificates(db, toCertificateQuery(filter)), listLots(db), listCellSpecifications(db)]);
  const filtered = Object.values(filter).some(Boolean);
  return (
    <>
      <PageHeader
        title="Certificates"
        lead="Signed reports of accepted runs. Each states its own number on every page and can be checked by anyone on its public page."
      />
      <form method="get" className="mb-4 flex flex-wrap items-end gap-3" aria-label="Filter certificates">
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium">Lot</span>
          <select name="lot" defaultValue={filter.lot ?? ""} className={selectClass}>
            <option value="">any lot</option>
            {lots.map((l) => (
              <option key={l.id} value={l.id}>
                {l.identifier}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium">Cell specification</span>
          <select name="spec" defaultValue={filter.spec ?? ""} className={selectClass}>
            <option value="">any cell</option>
            {specs.map((s) => (
              <option key={s.id} value={s.id}>
                {s.maker} {s.model}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium">Issued from</span>
          <input type="date" name="from" defaultValue={filter.from ?? ""} className={selectClass} />
        </label>
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium">Issued to</span>
          <input type="date" name="to" defaultValue={filter.to ?? ""} className={selectClass} />
        </label>
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium">Statement of conformity</span>
          <select name="verdict" defaultValue={filter.verdict ?? ""} className={selectClass}>
            <option value="">any</option>
            <option value="conforms">conforms</option>
            <option value="does not conform">does not conform</option>
            <option value="conditional pass">conditional pass</option>
            <option value="conditional fail">conditional fail</option>
            <option value="not decided">not decided</option>
          </select>
        </label>
        <button type="submit" className="rounded border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-paper hover:bg-copper-deep">
          Show
        </button>
        {filtered && (
          <Link href="/certificates" className="py-1.5 text-sm text-copper-deep underline">
            Clear the filter
          </Link>
        )}
      </form>
      <div className="overflow-x-auto">
        <table className="figures w-full border-collapse text-sm">
          <thead>
            <tr className="border-b border-rule text-left">
              <th className="py-2 pr-3">Certificate</th>
              <th className="py-2 pr-3">State</th>
              <th className="py-2 pr-3">Statement of conformity</th>
              <th className="py-2 pr-3">Specimen or lot</th>
              <th className="py-2 pr-3">Cell</th>
              <th className="py-2 pr-3">Issued</th>
              <th className="py-2">PDF</th>
            </tr>
          </thead>
          <tbody>
            {certificates.map((c) => (
              <tr key={c.id} className="border-b border-rule">
                <td className="py-2 pr-3">
                  <Link href={`/certificates/${c.number}`} className="font-mono font-medium text-copper-deep underline">
                    {c.number}
                  </Link>
                  {c.replacesNumber && <span className="block text-xs text-ink-soft">replaces {c.replacesNumber}</span>}
                </td>
                <td className="py-2 pr-3">
                  <CertificateStatusWords status={c.status} />
                </td>
                <td className="py-2 pr-3">
                  <VerdictWords verdict={c.verdict} />
                </td>
                <td className="py-2 pr-3">
                  {c.specimenIdentifier ?? c.lotIdentifier}
                  {c.runNumber && <span className="block text-xs text-ink-soft">run {c.runNumber}</span>}
                </td>
                <td className="py-2 pr-3">{c.cellLabel}</td>
                <td className="py-2 pr-3 whitespace-nowrap">
                  {formatDateTime(c.issuedAt)}
                  <span className="block text-xs text-ink-soft">{c.issuedByName}</span>
                </td>
                <td className="py-2">
                  <a href={`/api/certificates/${c.number}/pdf`} className="text-copper-deep underline">
                    Download
                  </a>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        {certificates.length === 0 && <p className="py-6 text-ink-soft">{filtered ? "No certificate matches this filter." : "No certificate has been issued yet."}</p>}
      </div>
    </>
  );
}
