import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { z } from "zod";
import { StepSheet } from "@/components/runs/step-sheet/step-sheet";
import { RichTextView } from "@/components/rich-text/rich-text-view";
import { Notice } from "@/components/ui/notice";
import { getDb } from "@/db";
import { getInstrument } from "@/db/instruments";
import { getProcedureVersionById } from "@/db/procedures";
import { getLatestRunReview } from "@/lib/reviews/run-reviews";
import { getRun, listRunInstrumentIds, listStepRecords } from "@/db/runs";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { formatDateTime } from "@/lib/format-date-time";
import { INSTRUMENT_KIND_LABELS } from "@/lib/instruments/instrument-kind";
import { isRunOpen, RUN_STATUS_WORDS } from "@/lib/runs/run-status";
import { readSubmitReadiness } from "@/lib/runs/submit-readiness";
import { abandonRunAction, correctStepAction, markStepEndAction, markStepStartAction, saveStepRecordAction, submitRunAction } from "../actions";

export const metadata: Metadata = { title: "Step sheet" };

export default async function StepSheetPage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageAccess("/runs/[id]");
  const id = z.uuid().safeParse((await params).id);
  if (!id.success) notFound();
  const cycles = z.coerce.number<unknown>().int().min(1).max(100).catch(1).parse((await searchParams).cycles);
  const db = getDb();
  const [run, records, instrumentIds] = await Promise.all([getRun(db, id.data), listStepRecords(db, id.data), listRunInstrumentIds(db, id.data)]);
  if (!run) notFound();
  const [version, instruments, lastReview, readiness] = await Promise.all([
    getProcedureVersionById(db, run.procedureVersionId),
    Promise.all(instrumentIds.map((i) => getInstrument(db, i))),
    run.status === "returned" ? getLatestRunReview(db, run.id) : null,
    readSubmitReadiness(db, run.id),
  ]);
  const open = isRunOpen(run.status);
  const mayOperate = can(user.role, "run.operate");
  const ambientInstruments = instruments
    .filter((i) => i !== null && (i.kind === "thermometer" || i.kind === "climate-chamber"))
    .map((i) => ({ identifier: i!.identifier, label: `${INSTRUMENT_KIND_LABELS[i!.kind]} ${i!.identifier}` }));
  const closedReason = !mayOperate
    ? "Your role reads runs; only an operator records steps."
    : `This run is ${RUN_STATUS_WORDS[run.status].words}; its records can no longer change.`;
  // The History tab keeps the whole audit trail; the sheet says why the run stopped.
  return (
    <div className="flex flex-col gap-4">
      {run.abandoned && (
        <div data-testid="abandoned-notice">
          <Notice title="Abandoned">
            {run.abandoned.by} abandoned this run on {formatDateTime(run.abandoned.at)}: {run.abandoned.reason}. Everything recorded below is kept; the run is not
            reviewed and counts in no statistic.
          </Notice>
        </div>
      )}
      {lastReview?.decision === "returned" && (
        <div data-testid="return-comments">
          <Notice
            title={`Returned to ${run.operator.id === user.id ? "you" : run.operator.name} by ${lastReview.reviewer.name} on ${formatDateTime(lastReview.createdAt)}: what to fix`}
          >
            <blockquote className="whitespace-pre-line border-l-2 border-ink-soft pl-3">{lastReview.comments}</blockquote>
            <p className="mt-2">
              Correct the records below (open “Correct this step…” on a line: the old entry stays, struck through) or upload the data log again, evaluate,
              then submit the run once more. Everything recorded so far is kept; the History tab shows
              each review.
            </p>
          </Notice>
        </div>
      )}
      <p className="text-sm text-ink-soft">
        Instruments on this run:{" "}
        {instruments.flatMap((i) => (i ? [`${INSTRUMENT_KIND_LABELS[i.kind]} ${i.identifier}`] : [])).join(", ") || "none recorded"}.
      </p>
      {version && (
        <Notice tone="caution" title="Safety cautions of the procedure">
          <RichTextView doc={version.cautions} empty="The procedure names no cautions." />
        </Notice>
      )}
      <p className="text-xs text-ink-soft">
        This sheet guides the run; it does not replace your lab&apos;s own safety rules, local codes or the text of the standard.
      </p>
      <StepSheet
        runId={run.id}
        resolution={run.resolution}
        stepRecords={records}
        cyclesRequested={cycles}
        editable={mayOperate && open}
        closedReason={closedReason}
        ambientInstruments={ambientInstruments}
        actions={{
          markStart: markStepStartAction,
          markEnd: markStepEndAction,
          save: saveStepRecordAction,
          submit: submitRunAction,
          correct: correctStepAction,
          abandon: abandonRunAction,
        }}
        submitReadiness={{ problems: readiness.problems, deviations: readiness.evaluation?.deviations ?? null }}
      />
    </div>
  );
}
