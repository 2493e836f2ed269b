import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { z } from "zod";
import { SignatureManifestation } from "@/components/signatures/signature-manifestation";
import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { listRunReviews, type RunReviewView } from "@/lib/reviews/run-reviews";
import { requirePageAccess } from "@/lib/auth/guards";
import { describeAuditAction, summariseAuditChange } from "@/lib/audit-labels";
import { formatDateTime } from "@/lib/format-date-time";

export const metadata: Metadata = { title: "Run history" };

const TRAIL_LIMIT = 500;
const DECISION_WORDS: Record<RunReviewView["decision"], string> = { returned: "Returned to the operator", accepted: "Accepted" };

/** Everything that happened to the run, read-only: its reviews with their signatures, then its audit trail. */
export default async function RunHistoryPage({ params }: { params: Promise<{ id: string }> }) {
  await requirePageAccess("/runs/[id]/history");
  const id = z.uuid().safeParse((await params).id);
  if (!id.success) notFound();
  const [reviews, newestFirst] = await Promise.all([
    listRunReviews(getDb(), id.data),
    listAuditEvents(getDb(), { entityType: "run", entityId: id.data, limit: TRAIL_LIMIT }),
  ]);
  // A run's story reads from the top down, like the step sheet.
  const events = [...newestFirst].reverse();
  return (
    <div className="flex flex-col gap-8">
      <section aria-labelledby="reviews-heading">
        <h2 id="reviews-heading" className="mb-2 text-lg font-semibold">
          Reviews
        </h2>
        {reviews.length === 0 ? (
          <p className="text-sm text-ink-soft">No engineer has reviewed this run yet.</p>
        ) : (
          <ol className="flex max-w-4xl flex-col gap-3" data-testid="run-reviews">
            {reviews.map((r) => (
              <li key={r.id} className="rounded border border-rule bg-white p-3 text-sm">
                <p>
                  <strong>{DECISION_WORDS[r.decision]}</strong> by {r.reviewer.name}, <span className="figures">{formatDateTime(r.createdAt)}</span>
                </p>
                {r.comments && <blockquote className="mt-1 whitespace-pre-line border-l-2 border-rule pl-3">{r.comments}</blockquote>}
                {r.acknowledgedDeviations.length > 0 && (
                  <ul className="mt-1 list-disc pl-5">
                    {r.acknowledgedDeviations.map((a) => (
                      <li key={a.findingId}>
                        Note on deviation “{a.findingTitle ?? a.findingId}”: {a.note}
                      </li>
                    ))}
                  </ul>
                )}
                {r.signature && (
                  <p className="mt-1">
                    <SignatureManifestation signature={r.signature} />
                  </p>
                )}
              </li>
            ))}
          </ol>
        )}
      </section>
      <section aria-labelledby="trail-heading">
        <h2 id="trail-heading" className="mb-1 text-lg font-semibold">
          Audit trail of this run
        </h2>
        <p className="mb-2 text-sm text-ink-soft">
          Every change to the run, oldest first{newestFirst.length === TRAIL_LIMIT ? ` (the latest ${TRAIL_LIMIT})` : ""}. The database accepts new entries only.
        </p>
        <Table data-testid="run-audit-trail">
          <TableHead>
            <HeaderCell>
              When (UTC)
            </HeaderCell>
            <HeaderCell>
              Who
            </HeaderCell>
            <HeaderCell>
              What
            </HeaderCell>
            <HeaderCell>
              Details
            </HeaderCell>
          </TableHead>
          <tbody>
            {events.map((e) => (
              <Row key={e.id} top>
                <Cell className="figures whitespace-nowrap">{e.at.toISOString().replace("T", " ").slice(0, 19)}</Cell>
                <Cell>{e.actorLabel}</Cell>
                <Cell>{describeAuditAction(e.action)}</Cell>
                <Cell className="text-xs [overflow-wrap:anywhere]">
                  <ChangeLines lines={summariseAuditChange(e.before, e.after, e.detail)} />
                </Cell>
              </Row>
            ))}
          </tbody>
        </Table>
      </section>
    </div>
  );
}

function ChangeLines({ lines }: { lines: string[] }) {
  if (lines.length === 0) return <>—</>;
  return (
    <ul>
      {lines.map((l, i) => (
        <li key={i}>{l}</li>
      ))}
    </ul>
  );
}
