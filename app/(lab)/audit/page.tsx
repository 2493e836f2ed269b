import type { Metadata } from "next";
import Link from "next/link";
import { z } from "zod";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { requirePagePermission } from "@/lib/auth/guards";
import { AUDIT_ACTION_LABELS, describeAuditAction, summariseAuditChange } from "@/lib/audit-labels";

export const metadata: Metadata = { title: "Audit trail" };

const PAGE_SIZE = 50;
const searchSchema = z.object({
  action: z.string().max(60).optional().catch(undefined),
  before: z.string().regex(/^\d+$/).optional().catch(undefined),
});

export default async function AuditPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  await requirePagePermission("audit.read");
  const { action, before } = searchSchema.parse(await searchParams);
  const events = await listAuditEvents(getDb(), { action: action || undefined, beforeId: before, limit: PAGE_SIZE });
  const last = events.at(-1);
  return (
    <>
      <PageHeader
        title="Audit trail"
        lead="Every sign-in, change and refusal, newest first. The database accepts new entries only: nothing here can be edited or removed."
      />
      <form className="mb-4 flex flex-wrap items-end gap-2" role="search">
        <label className="flex flex-col text-sm">
          What happened
          <select name="action" defaultValue={action ?? ""} className="rounded border border-rule bg-white px-2 py-1.5">
            <option value="">everything</option>
            <option value="auth.">sign-in and sign-out</option>
            <option value="user.">user changes</option>
            <option value="security.">refused requests</option>
            <option value="procedure.">procedures</option>
            <option value="spec.">cell specifications</option>
            <option value="instrument.">instruments</option>
            <option value="lot.">lots</option>
            <option value="specimen.">specimens</option>
            <option value="run.">runs</option>
            {Object.entries(AUDIT_ACTION_LABELS).map(([code, label]) => (
              <option key={code} value={code}>
                only: {label}
              </option>
            ))}
          </select>
        </label>
        <button type="submit" className="rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper">
          Show
        </button>
      </form>
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-sm">
          <thead>
            <tr className="border-b border-rule text-left">
              <th className="py-2 pr-3">When (UTC)</th>
              <th className="py-2 pr-3">Who</th>
              <th className="py-2 pr-3">What</th>
              <th className="py-2 pr-3">Record</th>
              <th className="py-2 pr-3">Details</th>
              <th className="py-2">From</th>
            </tr>
          </thead>
          <tbody>
            {events.map((e) => (
              <tr key={e.id} className="border-b border-rule align-top">
                <td className="figures whitespace-nowrap py-2 pr-3">{e.at.toISOString().replace("T", " ").slice(0, 19)}</td>
                <td className="py-2 pr-3">{e.actorLabel}</td>
                <td className="py-2 pr-3">{describeAuditAction(e.action)}</td>
                <td className="py-2 pr-3">
                  {e.entityType ? (
                    <>
                      {e.entityType} {e.entityLabel ?? <span className="font-mono text-xs">{e.entityId}</span>}
                    </>
                  ) : (
                    "—"
                  )}
                </td>
                <td className="py-2 pr-3 text-xs [overflow-wrap:anywhere]">
                  <ChangeLines lines={summariseAuditChange(e.before, e.after, e.detail)} />
                </td>
                <td className="py-2">{e.address ?? "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
        {events.length === 0 && <p className="py-6 text-ink-soft">No entries match.</p>}
      </div>
      {events.length === PAGE_SIZE && last && (
        <p className="mt-4">
          <Link href={`/audit?${new URLSearchParams({ ...(action ? { action } : {}), before: last.id })}`} className="text-copper-deep underline">
            Older entries
          </Link>
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
