import type { Metadata } from "next";
import { Notice } from "@/components/ui/notice";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { requirePageAccess } from "@/lib/auth/guards";
import { INTEGRITY_FAULT_ACTION } from "@/lib/integrity/read-verified-file";
import { describeChainBreak, verifyAuditChain } from "@/lib/integrity/verify-audit-chain";
import { verifyStoredFiles } from "@/lib/integrity/verify-stored-files";

export const metadata: Metadata = { title: "Integrity" };

const FAULTS_SHOWN = 100;

function faultDetail(detail: unknown): { record: string; problem: string; during: string } {
  const d = (detail ?? {}) as Record<string, unknown>;
  return { record: String(d.record ?? "a stored file"), problem: String(d.problem ?? ""), during: String(d.during ?? "") };
}

async function runCheck() {
  const started = performance.now();
  const chain = await verifyAuditChain(getDb());
  const files = await verifyStoredFiles(getDb());
  return { chain, files, seconds: (performance.now() - started) / 1000 };
}

/**
 * Admins see every stored file that was refused because it no longer matched its recorded hash (or was
 * missing), and can run the same check `npm run verify` runs: the audit chain and every stored file.
 */
export default async function IntegrityPage({ searchParams }: { searchParams: Promise<{ check?: string }> }) {
  await requirePageAccess("/admin/integrity");
  const { check } = await searchParams;
  const [faults, result] = await Promise.all([
    listAuditEvents(getDb(), { action: INTEGRITY_FAULT_ACTION, limit: FAULTS_SHOWN }),
    check === "now" ? runCheck() : Promise.resolve(null),
  ]);
  return (
    <>
      <PageHeader
        title="Integrity"
        lead="Every stored file (data logs, datasheets, certificate PDFs) is handed out only if its bytes still hash to the SHA-256 recorded when it arrived, and every audit entry is chained to the one before by its hash. Here you see what was refused, and can check everything now."
        actions={
          <form method="get">
            <input type="hidden" name="check" value="now" />
            <button type="submit" className="rounded border border-copper bg-copper px-3 py-1.5 text-sm font-semibold text-paper hover:bg-copper-deep">
              Check everything now
            </button>
          </form>
        }
      />
      {result && (
        <section aria-labelledby="check-result" className="mb-8 grid gap-3" data-testid="integrity-check">
          <h2 id="check-result" className="text-lg font-bold">
            Check made now ({result.seconds.toFixed(1)} s)
          </h2>
          {result.chain.breaks.length === 0 ? (
            <Notice tone="done" title="Audit trail intact">
              All {result.chain.rows} entries are chained and each matches its hash.
              {result.chain.head && (
                <>
                  {" "}
                  Newest entry: place {result.chain.head.position}, hash <code className="break-all text-xs">{result.chain.head.hash}</code>. Write it down elsewhere to detect a later rewrite of the
                  whole tail.
                </>
              )}
            </Notice>
          ) : (
            <Notice tone="problem" title="Audit trail broken">
              <p>First broken link: {describeChainBreak(result.chain.breaks[0]!)}</p>
              {result.chain.breaks.length > 1 && <p className="mt-1">{result.chain.breaks.length - 1} further problems follow it; `npm run verify` lists them.</p>}
            </Notice>
          )}
          {result.files.faults.length === 0 ? (
            <Notice tone="done" title="Stored files intact">
              All {result.files.checked} stored files match the SHA-256 recorded when they arrived.
            </Notice>
          ) : (
            <Notice tone="problem" title={`${result.files.faults.length} of ${result.files.checked} stored files do not match`}>
              <ul className="list-disc pl-5">
                {result.files.faults.map((f) => (
                  <li key={f.file.id}>{f.message}</li>
                ))}
              </ul>
            </Notice>
          )}
        </section>
      )}
      <section aria-labelledby="refused">
        <h2 id="refused" className="text-lg font-bold">
          Files refused when someone asked for them
        </h2>
        <p className="mb-3 text-sm text-ink-soft">
          Each refusal is an entry in the audit trail. A refused file is never handed out; restore it from a backup (<code>npm run restore</code>) or find out who changed the file store. Times in UTC.
        </p>
        {faults.length === FAULTS_SHOWN && (
          <p className="mb-3 text-sm" data-testid="integrity-faults-cut">
            The latest {FAULTS_SHOWN} are shown;{" "}
            <TextLink href={`/audit?action=${encodeURIComponent(INTEGRITY_FAULT_ACTION)}`}>the audit trail lists every refusal</TextLink>.
          </p>
        )}
        {faults.length === 0 ? (
          <p className="text-sm" data-testid="no-integrity-faults">
            No stored file has been refused.
          </p>
        ) : (
          <Table data-testid="integrity-faults">
            <TableHead>
              <HeaderCell>When</HeaderCell>
              <HeaderCell>File</HeaderCell>
              <HeaderCell>What was wrong</HeaderCell>
              <HeaderCell>Asked for by</HeaderCell>
            </TableHead>
            <tbody>
              {faults.map((e) => {
                const d = faultDetail(e.detail);
                return (
                  <Row key={e.id} top>
                    <Cell className="whitespace-nowrap">{e.at.toISOString().slice(0, 19).replace("T", " ")}</Cell>
                    <Cell>{d.record}</Cell>
                    <Cell>{d.problem}</Cell>
                    <Cell>
                      {e.actorLabel}
                      {d.during && <span className="block text-ink-soft">{d.during}</span>}
                    </Cell>
                  </Row>
                );
              })}
            </tbody>
          </Table>
        )}
      </section>
    </>
  );
}
