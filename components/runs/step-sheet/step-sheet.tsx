import clsx from "clsx";
import Link from "next/link";
import { Notice } from "@/components/ui/notice";
import type { StepRecord } from "@/lib/conformance";
import type { ActionState } from "@/lib/forms/action-state";
import { formatNumber, type ProcedureResolution } from "@/protocols";
import { CurrentStepForm } from "./current-step-form";
import { describeResolvedKind } from "@/components/procedure-preview/format-resolved";
import { formatRecordedTime } from "./format-recorded-time";
import { layOutStepSheet, type SheetEntry } from "./lay-out-step-sheet";
import { MarkTimeButton } from "./mark-time-button";
import { StepRecordSummary } from "./step-record-summary";
import { StepSetPoints } from "./step-set-points";
import { AbandonRunForm } from "./abandon-run-form";
import { CorrectStepForm } from "./correct-step-form";
import { SubmitRunForm, type SubmitReadinessView } from "./submit-run-form";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

export interface StepSheetProps {
  runId: string;
  resolution: ProcedureResolution;
  stepRecords: StepRecord[];
  cyclesRequested: number;
  /** The viewer may operate and the run is still open. */
  editable: boolean;
  closedReason?: string;
  ambientInstruments: { identifier: string; label: string }[];
  actions: { markStart: Action; markEnd: Action; save: Action; submit: Action; correct: Action; abandon: Action };
  /** Log and evaluation as the submission needs them. */
  submitReadiness: SubmitReadinessView;
}

const STATE_WORDS: Record<SheetEntry["state"], { words: string; mark: string }> = {
  done: { words: "ticked", mark: "☑" },
  current: { words: "current step", mark: "▶" },
  waiting: { words: "to do", mark: "☐" },
};

/** The run as a paper checklist, top to bottom; only the current line takes records. */
export function StepSheet(props: StepSheetProps) {
  const { runId, resolution, stepRecords, cyclesRequested, editable } = props;
  const layout = layOutStepSheet({ resolution, stepRecords, cyclesRequested });
  const cautionMessages = new Map(resolution.cautions.map((c) => [c.code, c.message]));
  const blockLabel = resolution.repeat?.label;
  return (
    <div className="flex max-w-4xl flex-col gap-4">
      {!editable && props.closedReason && <Notice title="Read only">{props.closedReason}</Notice>}
      <ol className="flex flex-col gap-3" aria-label="Steps of this run">
        {layout.entries.map((entry) => (
          <li
            key={entry.key}
            data-testid={`step-line-${entry.key}`}
            data-state={entry.state}
            aria-current={entry.state === "current" ? "step" : undefined}
            className={clsx(
              "rounded border bg-white",
              entry.state === "current" ? "border-2 border-copper shadow-sm" : "border-rule",
              entry.state === "waiting" && "opacity-80",
            )}
          >
            <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1 border-b border-rule px-4 py-2">
              <span className="figures font-serif text-lg font-bold text-copper-deep">{entry.line}</span>
              <h2 className="font-semibold">
                {entry.step.label}
                {entry.inRepeatBlock && (
                  <span className="font-normal text-ink-soft">
                    {" "}
                    · {blockLabel ?? "repeated block"}, cycle {entry.cycle}
                  </span>
                )}
              </h2>
              <span className="text-xs text-ink-soft">{describeResolvedKind(entry.step)}</span>
              <span className="ml-auto text-sm font-medium" data-testid="step-state">
                <span aria-hidden="true">{STATE_WORDS[entry.state].mark} </span>
                {STATE_WORDS[entry.state].words}
              </span>
            </div>
            <div className="flex flex-col gap-3 px-4 py-3">
              {entry.state === "current" ? (
                <CurrentLine entry={entry} cautionMessages={cautionMessages} {...props} />
              ) : (
                <>
                  {entry.cautionCodes.length > 0 && (
                    <p className="text-sm">
                      <span aria-hidden="true">⚠ </span>
                      <span className="font-semibold">Caution: </span>
                      {entry.cautionCodes.map((c) => cautionMessages.get(c)).join(" ")}
                    </p>
                  )}
                  {entry.state === "waiting" && <StepSetPoints step={entry.step} />}
                  {entry.record && <StepRecordSummary step={entry.step} record={entry.record} />}
                  {entry.record && editable && (
                    <CorrectStepForm
                      // Closed and empty again once a correction is saved: the line above shows it.
                      key={JSON.stringify(entry.record)}
                      action={props.actions.correct}
                      runId={runId}
                      step={entry.step}
                      cycle={entry.cycle}
                      record={entry.record}
                      ambientInstruments={props.ambientInstruments}
                    />
                  )}
                </>
              )}
            </div>
          </li>
        ))}
      </ol>
      {layout.nextCycle !== null && editable && (
        <div className="flex flex-wrap items-center gap-3 rounded border border-dashed border-rule px-4 py-3 text-sm">
          <p>
            Cycle {layout.cyclesShown} is ticked. If its result does not meet the requirement, the procedure allows another cycle (at most{" "}
            {resolution.repeat?.maxCycles}).
          </p>
          <Link
            href={`/runs/${runId}?cycles=${layout.nextCycle}`}
            className="rounded border border-copper px-3 py-2 font-medium text-copper-deep hover:bg-copper-wash"
          >
            Add cycle {layout.nextCycle}
          </Link>
        </div>
      )}
      {editable && <SubmitRunForm action={props.actions.submit} runId={runId} ready={layout.allTicked} readiness={props.submitReadiness} />}
      {editable && <AbandonRunForm action={props.actions.abandon} runId={runId} />}
    </div>
  );
}

function CurrentLine({ entry, cautionMessages, ...props }: StepSheetProps & { entry: SheetEntry; cautionMessages: Map<string, string> }) {
  const { runId, editable, actions } = props;
  const record = entry.record;
  const key = { runId, stepId: entry.step.id, cycle: entry.cycle };
  const cautions = entry.cautionCodes.map((code) => ({ code, message: cautionMessages.get(code) ?? code }));
  return (
    <>
      <StepSetPoints step={entry.step} />
      <div className="flex flex-wrap items-start gap-4 text-sm">
        <div className="flex flex-col gap-1">
          <span className="text-ink-soft">Started</span>
          {record?.startedAt ? (
            <span className="figures font-medium" data-testid="step-started-at">
              {formatRecordedTime(record.startedAt)}
            </span>
          ) : editable ? (
            <MarkTimeButton action={actions.markStart} label="Mark start" cautions={cautions} {...key} />
          ) : (
            <span>not marked</span>
          )}
        </div>
        <div className="flex flex-col gap-1">
          <span className="text-ink-soft">Ended</span>
          {record?.endedAt ? (
            <span className="figures font-medium" data-testid="step-ended-at">
              {formatRecordedTime(record.endedAt)}
            </span>
          ) : editable && record?.startedAt ? (
            <MarkTimeButton action={actions.markEnd} label="Mark end" {...key} />
          ) : (
            <span>not marked</span>
          )}
        </div>
      </div>
      {editable ? (
        <CurrentStepForm
          // A fresh form after each save, so it shows what the server now holds.
          key={JSON.stringify(record)}
          action={actions.save}
          runId={runId}
          step={entry.step}
          cycle={entry.cycle}
          record={record}
          cautions={cautions}
          ambientInstruments={props.ambientInstruments}
          recordedReadings={(record?.ambientReadings ?? []).map((r) => ({
            text: `${formatNumber(r.celsius, { maxDecimals: 2 })} °C${r.instrumentId ? ` on ${r.instrumentId}` : ""} at ${formatRecordedTime(r.at)}`,
            note: [r.note, r.backdatedReason && `entered late: ${r.backdatedReason}`].filter(Boolean).join(" · "),
            struck: r.struck ? `struck by ${r.struck.by} at ${formatRecordedTime(r.struck.at)}: ${r.struck.reason}` : null,
          }))}
        />
      ) : (
        <StepRecordSummary step={entry.step} record={record} />
      )}
    </>
  );
}
