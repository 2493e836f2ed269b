import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { z } from "zod";
import { Notice } from "@/components/ui/notice";
import { getDb } from "@/db";
import { listRunCertificateNumbers } from "@/db/reviews";
import { listRunReviews } from "@/lib/reviews/run-reviews";
import { getCurrentRunLog } from "@/db/run-logs";
import { getLatestRunEvaluation } from "@/db/run-series";
import { describeRunParticipation } from "@/db/run-participants";
import { getRun } from "@/db/runs";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { formatDateTime } from "@/lib/format-date-time";
import { RUN_STATUS_WORDS } from "@/lib/runs/run-status";
import { AcceptedView } from "./accepted-view";
import { ReviewWorkspace } from "./review-workspace";

export const metadata: Metadata = { title: "Review" };

export default async function RunReviewPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageAccess("/runs/[id]/review");
  const id = z.uuid().safeParse((await params).id);
  if (!id.success) notFound();
  const db = getDb();
  const [run, stored, log, reviews, certificates, tookPart] = await Promise.all([
    getRun(db, id.data),
    getLatestRunEvaluation(db, id.data),
    getCurrentRunLog(db, id.data),
    listRunReviews(db, id.data),
    listRunCertificateNumbers(db, id.data),
    describeRunParticipation(db, id.data, user.id),
  ]);
  if (!run) notFound();
  const status = RUN_STATUS_WORDS[run.status].words;

  if (tookPart) {
    return (
      <div className="max-w-3xl" data-testid="review-refused">
        <Notice title="You took part in this run, so you cannot review it">
          <p>
            You {tookPart}. A run is reviewed and signed by an engineer who took no part in it, so that the check is independent of the people who did the
            work. Another engineer reviews run {run.number}; the database refuses a review or signature by anyone who took part, whatever the screen shows.
          </p>
          <p className="mt-2">
            The run is {status}.
            {run.status === "returned" && " The reviewer's comments are at the top of the step sheet."} The History tab shows every review and signature.
          </p>
        </Notice>
      </div>
    );
  }
  if (!can(user.role, "run.review")) {
    return (
      <div className="max-w-3xl">
        <Notice title="Engineers review runs">
          Runs are reviewed and signed by an engineer who did not operate them; your role reads them. Run {run.number} is {status}. The History tab shows its
          reviews, signatures and audit trail.
        </Notice>
      </div>
    );
  }
  if (run.status === "abandoned") {
    return (
      <div className="max-w-3xl">
        <Notice title="Abandoned">
          Run {run.number} was abandoned{run.abandoned ? ` by ${run.abandoned.by} on ${formatDateTime(run.abandoned.at)}: ${run.abandoned.reason}` : ""}. It is not
          reviewed and counts in no statistic.
        </Notice>
      </div>
    );
  }
  if (run.status === "planned" || run.status === "in_progress") {
    return (
      <div className="max-w-3xl">
        <Notice title="Not submitted yet">Run {run.number} is {status}. You can review it once its operator submits it.</Notice>
      </div>
    );
  }
  if (run.status === "returned") {
    const last = reviews.findLast((r) => r.decision === "returned");
    return (
      <div className="max-w-3xl">
        <Notice title="Returned to the operator">
          {last && (
            <p>
              {last.reviewer.name} returned run {run.number} on {formatDateTime(last.createdAt)} with these comments:
            </p>
          )}
          {last && <blockquote className="my-2 whitespace-pre-line border-l-2 border-rule pl-3">{last.comments}</blockquote>}
          <p>It comes back to review when {run.operator.name} submits it again.</p>
        </Notice>
      </div>
    );
  }
  // Written only by lib/runs/evaluate-stored-run.ts.
  const evaluation = stored ? { id: stored.id, evaluatedAt: stored.evaluatedAt, onCurrentLog: log === null || stored.runLogId === log.id, data: stored.evaluation } : null;
  if (run.status === "submitted") {
    return <ReviewWorkspace run={run} user={user} evaluation={evaluation} reviews={reviews} />;
  }
  return (
    <AcceptedView
      run={run}
      user={user}
      acceptance={reviews.findLast((r) => r.decision === "accepted") ?? null}
      certificates={certificates}
      mayIssue={can(user.role, "certificate.sign") && run.status === "accepted"}
    />
  );
}
