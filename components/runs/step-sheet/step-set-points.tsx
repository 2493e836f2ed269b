import clsx from "clsx";
import { formatTemperatureRange, formatTolerances, listSetPoints } from "@/components/procedure-preview/format-resolved";
import type { ResolvedStep } from "@/protocols";

/** What to program for one step: each set-point with where it came from, the ambient range and tolerances. */
export function StepSetPoints({ step }: { step: ResolvedStep }) {
  const tolerances = formatTolerances(step.tolerances);
  return (
    <div className="flex flex-col gap-2 text-sm">
      <dl className="grid gap-x-4 gap-y-1.5 sm:grid-cols-2">
        {listSetPoints(step).map((point) => (
          <div key={point.name}>
            <dt className="text-ink-soft">{point.name}</dt>
            <dd>
              <span className={clsx("figures text-base font-semibold", point.missing && "text-deviates")}>{point.value}</span>
              {point.explanation && <span className="figures block text-xs text-ink-soft">{point.explanation}</span>}
            </dd>
          </div>
        ))}
        <div>
          <dt className="text-ink-soft">Ambient</dt>
          <dd>
            <span className="figures font-semibold">{formatTemperatureRange(step.ambient)}</span>
            <span className="block text-xs text-ink-soft">{step.ambient.explanation}</span>
          </dd>
        </div>
        <div>
          <dt className="text-ink-soft">Tolerances</dt>
          <dd className="figures">
            {tolerances.text}
            <span className="block text-xs text-ink-soft">{tolerances.source}</span>
          </dd>
        </div>
      </dl>
      {step.instructions && (
        <p className="rounded border border-rule bg-paper-deep px-3 py-2">
          <span className="font-semibold">Instructions: </span>
          {step.instructions}
        </p>
      )}
    </div>
  );
}
