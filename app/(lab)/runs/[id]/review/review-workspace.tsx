import { VerdictWords } from "@/components/runs/results/verdict-words";
import { Notice } from "@/components/ui/notice";
import { TextLink } from "@/components/ui/text-link";
import type { RunReviewView } from "@/lib/reviews/run-reviews";
import type { RunView } from "@/db/runs";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import type { Finding, RunEvaluation } from "@/lib/conformance";
import { formatDateTime } from "@/lib/format-date-time";
import { listDeviatingFindings } from "@/lib/reviews/reviewed-record";
import { SIGNATURE_MEANING_WORDS } from "@/lib/signatures/sign-record";
import { AcceptRunForm } from "./accept-run-form";
import { acceptRunAction, returnRunAction } from "./actions";
import type { DeviationItem } from "./deviation-item";
import { ReturnRunForm } from "./return-run-form";

function toDeviationItems(evaluation: RunEvaluation): DeviationItem[] {
  const labels = new Map(evaluation.steps.map((s) => [s.stepId, s.label]));
  const where = (f: Finding) =>
    f.stepId === null ? "the run as a whole" : `${labels.get(f.stepId) ?? f.stepId}${f.cycle !== null && f.cycle > 1 ? ` (cycle ${f.cycle})` : ""}`;
  return listDeviatingFindings(evaluation).map((f) => ({
    id: f.id,
    where: where(f),
    title: f.title,
    expected: f.expected.text,
    observed: f.observed.text,
    clause: f.clause,
    safety: f.severity === "caution",
  }));
}

/** A submitted run as its reviewer sees it: what the checks say, the notes and signature, or a return. */
export function ReviewWorkspace({
  run,
  user,
  evaluation,
  reviews,
}: {
  run: RunView;
  user: SignedInUser;
  evaluation: { id: string; evaluatedAt: Date; onCurrentLog: boolean; data: RunEvaluation } | null;
  reviews: RunReviewView[];
}) {
  const returns = reviews.filter((r) => r.decision === "returned").length;
  return (
    <div className="flex max-w-4xl flex-col gap-8">
      <section aria-labelledby="what-heading">
        <h2 id="what-heading" className="mb-2 text-lg font-semibold">
          What the checks say
        </h2>
        <p className="mb-3 text-sm text-ink-soft">
          Submitted by {run.operator.name}
          {run.submittedAt && ` on ${formatDateTime(run.submittedAt)}`}
          {returns > 0 && ` · returned ${returns === 1 ? "once" : `${returns} times`} before (see History)`}. Read the{" "}
          <TextLink href={`/runs/${run.id}/results`}>
            findings, results and plots
          </TextLink>
          , the{" "}
          <TextLink href={`/runs/${run.id}`}>
            step sheet
          </TextLink>{" "}
          and the{" "}
          <TextLink href={`/runs/${run.id}/log`}>
            data log
          </TextLink>{" "}
          before you decide.
        </p>
        {evaluation ? (
          <>
            {evaluation.data.evaluatedAgainst.otherThanRunVersion && (
              <div className="mb-3">
                <Notice tone="caution" title="Judged against another version">
                  The latest evaluation used {evaluation.data.evaluatedAgainst.note ?? "another version of the procedure"}, not the version the run was carried out
                  under. You sign for this evaluation.
                </Notice>
              </div>
            )}
            {!evaluation.onCurrentLog && (
              <div className="mb-3">
                <Notice tone="problem" title="Made on an earlier data log">
                  The latest evaluation does not belong to the data log the run now holds. Evaluate the run again before accepting it.
                </Notice>
              </div>
            )}
            {/* The deviating findings are listed one by one below, each with its note: not twice. */}
            <VerdictWords verdict={{ ...evaluation.data.verdict, reasons: evaluation.data.verdict.reasons.filter((r) => !r.startsWith("Deviates — ")) }} />
            <p className="mt-2 text-xs text-ink-soft">Evaluated {formatDateTime(evaluation.evaluatedAt)}.</p>
          </>
        ) : (
          <Notice tone="problem" title="Not evaluated">
            This run has no evaluation, so there are no findings to sign for. Evaluate it on the Findings and results tab before accepting it, or return it to{" "}
            {run.operator.name}.
          </Notice>
        )}
      </section>

      {evaluation && (
        <section aria-labelledby="accept-heading" className="flex flex-col gap-3">
          <h2 id="accept-heading" className="text-lg font-semibold">
            Accept and sign
          </h2>
          <AcceptRunForm
            action={acceptRunAction}
            runId={run.id}
            runNumber={run.number}
            evaluationId={evaluation.id}
            signerName={user.displayName}
            meaningWords={SIGNATURE_MEANING_WORDS.reviewed}
            deviations={toDeviationItems(evaluation.data)}
          />
        </section>
      )}

      <section aria-labelledby="return-heading" className="flex flex-col gap-2 border-t border-rule pt-6">
        <h2 id="return-heading" className="text-lg font-semibold">
          Or return it to {run.operator.name}
        </h2>
        <ReturnRunForm action={returnRunAction} runId={run.id} operatorName={run.operator.name} />
      </section>
    </div>
  );
}
