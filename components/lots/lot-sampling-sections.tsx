import type { ReactNode } from "react";
import type { LotSampling } from "@/lib/lots/sampling/read-lot-sampling";
import type { ActionState } from "@/lib/forms/action-state";
import { formatDateTime } from "@/lib/format-date-time";
import { formatNumber } from "@/protocols/format-number";
import { DrawSampleForm } from "./draw-sample-form";
import { DrawnSampleTable } from "./drawn-sample-table";
import { LotDecisionView } from "./lot-decision-view";
import { SamplingPlanForm, type ProcedureChoice } from "./sampling-plan-form";
import { SamplingPlanView } from "./sampling-plan-view";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

interface Props {
  lot: { id: string; quantityReceived: number; planSetBy: { name: string; at: Date } | null };
  sampling: LotSampling;
  /** Engineers set the plan and draw the sample; operators and engineers register specimens. */
  can: { plan: boolean; register: boolean };
  procedures: readonly ProcedureChoice[];
  aqlLabels: readonly string[];
  actions: { setPlan: Action; draw: Action };
}

function Section({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <section aria-labelledby={`${id}-heading`} className="mb-10">
      <h2 id={`${id}-heading`} className="mb-3 text-lg font-bold">
        {title}
      </h2>
      {children}
    </section>
  );
}

function PlanSection({ lot, sampling, can, procedures, aqlLabels, actions }: Props) {
  const { plan, draw } = sampling;
  const form = can.plan && !draw && (
    <SamplingPlanForm
      action={actions.setPlan}
      lotId={lot.id}
      lotSize={lot.quantityReceived}
      aqlLabels={aqlLabels}
      procedures={procedures}
      initial={plan ? { inspectionLevel: plan.inspectionLevel, aql: plan.aqlLabel, acceptanceProcedureId: sampling.acceptanceProcedure?.id ?? "" } : null}
    />
  );
  return (
    <Section id="plan" title="Sampling plan">
      {plan ? (
        <SamplingPlanView plan={plan} acceptanceProcedure={sampling.acceptanceProcedure} setBy={lot.planSetBy && { name: lot.planSetBy.name, at: formatDateTime(lot.planSetBy.at) }} />
      ) : (
        <p className="mb-3 max-w-3xl text-sm text-ink-soft">
          No sampling plan yet. {can.plan ? "Choose the inspection level and AQL: the plan follows from ISO 2859-1." : "A quality engineer sets it."}
        </p>
      )}
      {form && plan ? (
        <details className="mt-4 max-w-4xl">
          <summary className="cursor-pointer text-sm font-medium text-copper-deep">Change the plan (possible until the sample is drawn)</summary>
          <div className="mt-3">{form}</div>
        </details>
      ) : (
        form && <div className="max-w-4xl">{form}</div>
      )}
      {draw && <p className="mt-3 text-sm text-ink-soft">The sample is drawn, so this plan is fixed.</p>}
    </Section>
  );
}

function describeDraw(sampling: LotSampling, lotSize: number): string {
  const d = sampling.draw;
  if (!d) return "";
  const who = `by ${d.drawnBy}, ${formatDateTime(d.drawnAt)}`;
  if (d.method === "chosen" && d.positions.length === lotSize) return `The whole lot, tray positions 1 to ${formatNumber(lotSize)}, taken as the sample ${who} (100 % inspection).`;
  if (d.method === "chosen") return `${formatNumber(d.positions.length)} tray positions chosen and entered ${who}.`;
  return (
    `${formatNumber(d.positions.length)} of the tray positions 1 to ${formatNumber(lotSize)} drawn at random ${who}, with seed ${d.seed}: ` +
    `positions shuffled by Fisher–Yates driven by the mulberry32 generator from the seed, the first ${formatNumber(d.positions.length)} taken. ` +
    `The same seed gives the same draw.`
  );
}

function DrawSection({ lot, sampling, can, actions }: Props) {
  const { plan, draw } = sampling;
  return (
    <Section id="draw" title="Drawn sample">
      {draw ? (
        <>
          <p className="mb-3 max-w-3xl text-sm" data-testid="draw-summary">
            {describeDraw(sampling, lot.quantityReceived)}
          </p>
          <DrawnSampleTable lotId={lot.id} members={sampling.members} canRegister={can.register} />
        </>
      ) : !plan ? (
        <p className="text-sm text-ink-soft">The sample is drawn once the lot has a sampling plan.</p>
      ) : can.plan ? (
        <DrawSampleForm action={actions.draw} lotId={lot.id} n={plan.sampleSize} lotSize={lot.quantityReceived} />
      ) : (
        <p className="text-sm text-ink-soft">Not drawn yet: a quality engineer draws the {formatNumber(plan.sampleSize)} cells.</p>
      )}
    </Section>
  );
}

/** The lot page's sampling: plan, drawn sample and lot decision, with the forms the role may use. */
export function LotSamplingSections(props: Props) {
  return (
    <>
      <PlanSection {...props} />
      <DrawSection {...props} />
      <Section id="decision" title="Lot decision">
        <LotDecisionView sampling={props.sampling} />
      </Section>
    </>
  );
}
