import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { DatasheetUpload } from "@/components/specs/datasheet-upload";
import { SPEC_NUMBER_FIELDS } from "@/components/specs/spec-fields";
import { PageHeader } from "@/components/ui/page-header";
import { PlainLink, TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { getCellSpecification } from "@/db/cell-specifications";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { computeItAmperes, formatNumber, positiveElectrodeNames } from "@/protocols";

export const metadata: Metadata = { title: "Cell specification" };

export default async function SpecPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageAccess("/specs/[id]");
  const id = z.uuid().safeParse((await params).id);
  const spec = id.success ? await getCellSpecification(getDb(), id.data) : null;
  if (!spec) notFound();
  const manage = can(user.role, "spec.manage");
  const it = computeItAmperes(spec.data.ratedCapacityMah);
  return (
    <>
      <PageHeader
        title={`${spec.maker} ${spec.model}`}
        lead={
          <>
            Designation <span className="font-mono">{spec.designation}</span> · {spec.data.chemistry.label} (positive electrode{" "}
            {positiveElectrodeNames[spec.data.chemistry.positiveElectrode]}), {spec.data.shape}
          </>
        }
        actions={
          manage && (
            <Link href={`/specs/${spec.id}/edit`} className="rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper">
              Edit values
            </Link>
          )
        }
      />
      <dl className="figures grid max-w-3xl gap-x-6 gap-y-1 text-sm sm:grid-cols-[1fr_auto]">
        {SPEC_NUMBER_FIELDS.filter((f) => spec.data[f.key] !== undefined).map((f) => (
          <div key={f.key} className="contents">
            <dt className="border-b border-rule py-1 text-ink-soft">{f.label}</dt>
            <dd className="border-b border-rule py-1 text-right">
              {formatNumber(spec.data[f.key]!, { maxDecimals: 3 })} {f.unit}
            </dd>
          </div>
        ))}
        <div className="contents">
          <dt className="py-1 font-medium">It (rated capacity ÷ 1 h, IEC 61434)</dt>
          <dd className="py-1 text-right font-medium" data-testid="it">
            {formatNumber(it, { maxDecimals: 4 })} A
          </dd>
        </div>
        <div className="contents">
          <dt className="py-1">0.2 It, the rated-capacity test current</dt>
          <dd className="py-1 text-right" data-testid="it-0.2">
            {formatNumber(0.2 * it, { maxDecimals: 4 })} A
          </dd>
        </div>
      </dl>
      <p className="mt-6 text-sm">
        <TextLink href={`/specs/${spec.id}/measured`}>
          Measured against the datasheet: statistics of every reviewed result of this cell
        </TextLink>
      </p>
      <section aria-labelledby="datasheet" className="mt-8 max-w-3xl rounded border border-rule bg-white p-4">
        <h2 id="datasheet" className="mb-2 text-lg font-bold">
          Datasheet
        </h2>
        {spec.datasheet ? (
          <p className="mb-3 text-sm">
            <PlainLink href={`/api/specs/${spec.id}/datasheet`}>
              {spec.datasheet.name}
            </PlainLink>{" "}
            ({formatNumber(spec.datasheet.sizeBytes / 1024, { maxDecimals: 0 })} KiB) · SHA-256{" "}
            <span className="font-mono text-xs [overflow-wrap:anywhere]">{spec.datasheet.sha256}</span>
          </p>
        ) : (
          <p className="mb-3 text-sm text-ink-soft">No datasheet on file.</p>
        )}
        {manage && <DatasheetUpload specId={spec.id} />}
      </section>
    </>
  );
}
