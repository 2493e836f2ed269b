import clsx from "clsx";
import { Table } from "@/components/ui/table";
import type { ResolvedStep } from "@/protocols";
import { describeResolvedKind, formatTemperatureRange, formatTolerances, listSetPoints } from "./format-resolved";

/** One row per step: every set-point with its value, unit and where it came from. */
export function ResolvedStepsTable({ steps, flaggedStepIds }: { steps: readonly ResolvedStep[]; flaggedStepIds: ReadonlySet<string> }) {
  return (
    <div className="overflow-x-auto rounded border border-rule bg-white">
      <Table>
        <caption className="caption-bottom px-2 py-1.5 text-left text-xs text-ink-soft">
          Tolerances: U voltage, I current, T temperature, t time. Each value says where it comes from.
        </caption>
        <thead className="bg-paper-deep text-left">
          <tr>
            <th scope="col" className="px-2 py-1.5 w-[22%]">
              Step
            </th>
            <th scope="col" className="px-2 py-1.5">
              Set-points
            </th>
            <th scope="col" className="px-2 py-1.5 w-[17%]">
              Ambient
            </th>
            <th scope="col" className="px-2 py-1.5 w-[17%]">
              Tolerances
            </th>
          </tr>
        </thead>
        <tbody>
          {steps.map((step) => (
            <StepRow key={`${step.index}-${step.id}`} step={step} flagged={flaggedStepIds.has(step.id)} />
          ))}
        </tbody>
      </Table>
    </div>
  );
}

function StepRow({ step, flagged }: { step: ResolvedStep; flagged: boolean }) {
  const tolerances = formatTolerances(step.tolerances);
  return (
    <tr className={clsx("border-t border-rule align-top", flagged && "bg-copper-wash")} data-testid={`resolved-step-${step.id}`}>
      <th scope="row" className="px-2 py-1.5 text-left font-normal">
        <span className="figures font-serif font-bold text-copper-deep">{step.index + 1}</span> <span className="font-medium">{step.label}</span>
        <span className="block text-xs text-ink-soft">
          {describeResolvedKind(step)} · id {step.id}
        </span>
        {flagged && <span className="block text-xs font-medium">See the notes above</span>}
      </th>
      <td className="px-2 py-1.5">
        <dl className="flex flex-col gap-1">
          {listSetPoints(step).map((point) => (
            <div key={point.name}>
              <dt className="inline text-ink-soft">{point.name}: </dt>
              <dd className="inline">
                <span className={clsx("figures font-medium", point.missing && "text-deviates")}>{point.value}</span>
                {point.explanation && <span className="figures block text-xs text-ink-soft">{point.explanation}</span>}
              </dd>
            </div>
          ))}
        </dl>
      </td>
      <td className="px-2 py-1.5">
        <span className="figures whitespace-nowrap">{formatTemperatureRange(step.ambient)}</span>
        <span className="block text-xs text-ink-soft">{step.ambient.from === "step" ? "set on the step" : "from the procedure"}</span>
      </td>
      <td className="figures px-2 py-1.5 text-xs">
        {tolerances.text}
        <span className="block text-ink-soft">{tolerances.source}</span>
      </td>
    </tr>
  );
}
