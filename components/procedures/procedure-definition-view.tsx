import { RichTextView } from "@/components/rich-text/rich-text-view";
import type { RichTextDoc } from "@/lib/rich-text";
import { describeCautionCode, describeCriterion, describeRetentionSetting, describeStep, explainDecisionRule, formatQuantity, nameDecisionRule, readDecisionRule, type Procedure } from "@/protocols";

/** A procedure version read like a paper method sheet: header, steps in order, criteria, cautions. */
export function ProcedureDefinitionView({
  definition,
  instructions,
  cautions,
  acknowledgedCautions,
}: {
  definition: Procedure;
  instructions: RichTextDoc;
  cautions: RichTextDoc;
  acknowledgedCautions: string[];
}) {
  const { header, steps, acceptance, repeat } = definition;
  // A definition stored before procedures named a rule was judged by simple acceptance.
  const decisionRule = readDecisionRule(definition);
  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="scope" className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[12rem_1fr]">
        <h2 id="scope" className="sr-only">
          Header
        </h2>
        <span className="text-ink-soft">Scope</span>
        <span>{header.scope}</span>
        <span className="text-ink-soft">Standard, clause</span>
        <span>
          {header.standard}, clause {header.clause}
        </span>
        <span className="text-ink-soft">Ambient (unless a step says otherwise)</span>
        <span className="figures">{formatQuantity(header.ambient)}</span>
      </section>
      {header.notes && header.notes.length > 0 && (
        <section aria-labelledby="notes" className="rounded border border-dashed border-copper bg-copper-wash p-3 text-sm">
          <h2 id="notes" className="mb-1 font-bold">
            Notes on the values
          </h2>
          <ul className="list-disc pl-5">
            {header.notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        </section>
      )}
      <section aria-labelledby="steps">
        <h2 id="steps" className="mb-2 text-lg font-bold">
          Steps
        </h2>
        <ol className="flex flex-col divide-y divide-rule rounded border border-rule bg-white">
          {steps.map((s, i) => (
            <li key={s.id} className="grid gap-1 p-3 sm:grid-cols-[2.5rem_1fr]">
              <span className="figures font-serif text-lg font-bold text-copper-deep">{i + 1}</span>
              <div>
                <p className="font-medium">
                  {s.label} <span className="text-xs text-ink-soft">({s.kind}, id {s.id})</span>
                </p>
                <p className="text-sm">{describeStep(s)}</p>
                {"ambient" in s && s.ambient && <p className="figures text-xs text-ink-soft">Ambient for this step: {formatQuantity(s.ambient)}</p>}
                {s.instructions && <p className="mt-1 text-sm italic">{s.instructions}</p>}
              </div>
            </li>
          ))}
        </ol>
      </section>
      <section aria-labelledby="acceptance">
        <h2 id="acceptance" className="mb-2 text-lg font-bold">
          Acceptance criteria
        </h2>
        {acceptance.length === 0 ? (
          <p className="text-sm text-ink-soft">None: this procedure reports results without a pass/fail statement.</p>
        ) : (
          <ul className="list-disc pl-5 text-sm">
            {acceptance.map((c) => (
              <li key={c.id}>{describeCriterion(c, definition.steps)}</li>
            ))}
          </ul>
        )}
        {acceptance.length > 0 && (
          <p className="mt-2 text-sm" data-testid="decision-rule">
            <span className="font-semibold">Decision rule:</span> {nameDecisionRule(decisionRule)}. <span className="text-ink-soft">{explainDecisionRule(decisionRule)}</span>
          </p>
        )}
        {definition.retention && (
          <p className="mt-2 text-sm" data-testid="retention-setting">
            {describeRetentionSetting(definition.retention, definition.steps)}
          </p>
        )}
        {repeat && (
          <p className="mt-2 text-sm">
            Repeat “{repeat.label}” (steps {repeat.stepIds.join(", ")}) up to {repeat.maxCycles} times, stopping at the first cycle that meets{" "}
            {repeat.stopWhenMet}.
          </p>
        )}
      </section>
      <section aria-labelledby="instructions">
        <h2 id="instructions" className="mb-2 text-lg font-bold">
          Instructions
        </h2>
        <RichTextView doc={instructions} empty="No instructions written." />
      </section>
      <section aria-labelledby="cautions" className="rounded border-l-4 border-copper bg-copper-wash p-4">
        <h2 id="cautions" className="mb-2 text-lg font-bold">
          <span aria-hidden="true">⚠ </span>Safety cautions
        </h2>
        <RichTextView doc={cautions} empty="No cautions written: the lab's general safety rules apply." />
        {acknowledgedCautions.length > 0 && (
          <div className="mt-2 text-sm">
            <p>Acknowledged on this version (beyond the cell rating on purpose):</p>
            <ul className="list-inside list-disc" data-testid="acknowledged-cautions">
              {acknowledgedCautions.map((code) => (
                <li key={code}>{describeCautionCode(code, definition.steps)}</li>
              ))}
            </ul>
          </div>
        )}
        <p className="mt-2 text-xs text-ink-soft">The lab&apos;s own safety rules, local codes and the text of the standard prevail over this sheet.</p>
      </section>
    </div>
  );
}
