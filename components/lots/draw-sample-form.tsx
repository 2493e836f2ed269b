"use client";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { useFormAction } from "@/components/ui/use-form-action";
import type { ActionState } from "@/lib/forms/action-state";
import { formatNumber } from "@/protocols/format-number";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

function Outcome({ state }: { state: ActionState }) {
  if (!state.message) return null;
  return (
    <Notice tone={state.ok ? "done" : "problem"} role={state.ok ? "status" : "alert"} title={state.ok ? "Drawn" : "Not drawn"}>
      {state.message}
    </Notice>
  );
}

/** A random draw with an optional seed: the server picks one when left empty, and records it either way. */
function RandomDraw({ action, lotId, n, lotSize }: { action: Action; lotId: string; n: number; lotSize: number }) {
  const { state, onSubmit, pending } = useFormAction(action);
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Draw at random" className="flex flex-col gap-3">
      <Outcome state={state} />
      <input type="hidden" name="lotId" value={lotId} />
      <input type="hidden" name="method" value="random" />
      <div className="flex flex-wrap items-start gap-3">
        <div className="w-56">
          <Field
            label="Seed, optional"
            name="seed"
            inputMode="numeric"
            errors={state.fieldErrors?.seed}
            hint="Leave empty to let the server pick one. It is recorded, so anyone can repeat the draw."
          />
        </div>
        <Button type="submit" disabled={pending} className="mt-6">
          {pending ? "Drawing…" : `Draw ${formatNumber(n)} cells at random`}
        </Button>
      </div>
      <p className="text-xs text-ink-soft">
        Draws {formatNumber(n)} of the tray positions 1 to {formatNumber(lotSize)} without replacement. The draw is made once and never changed.
      </p>
    </form>
  );
}

/** Positions chosen outside the workbench (a random-number table, the customer's own list), typed in. */
function ChosenDraw({ action, lotId, n, lotSize }: { action: Action; lotId: string; n: number; lotSize: number }) {
  const { state, onSubmit, pending } = useFormAction(action);
  return (
    <details className="rounded border border-rule bg-white/60 px-4 py-2">
      <summary className="cursor-pointer text-sm font-medium">Or enter the drawn tray positions yourself</summary>
      <form onSubmit={onSubmit} noValidate aria-label="Enter drawn positions" className="mt-3 flex flex-col gap-3">
        <Outcome state={state} />
        <input type="hidden" name="lotId" value={lotId} />
        <input type="hidden" name="method" value="chosen" />
        <Field
          label={`Tray positions (${formatNumber(n)}, from 1 to ${formatNumber(lotSize)})`}
          name="positions"
          errors={state.fieldErrors?.positions}
          hint="Separate them with commas or spaces, in the order they were drawn."
        >
          <textarea
            id="field-positions"
            name="positions"
            rows={2}
            aria-describedby="field-positions-hint field-positions-error"
            aria-invalid={state.fieldErrors?.positions?.length ? true : undefined}
            className="rounded border border-rule bg-white px-2 py-1.5 font-mono aria-[invalid=true]:border-deviates"
          />
        </Field>
        <Button type="submit" variant="secondary" disabled={pending} className="self-start">
          {pending ? "Recording…" : "Record these positions"}
        </Button>
      </form>
    </details>
  );
}

/** When n reaches the lot size every cell is inspected: the sample is simply all tray positions. */
function WholeLot({ action, lotId, lotSize }: { action: Action; lotId: string; lotSize: number }) {
  const { state, onSubmit, pending } = useFormAction(action);
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Take the whole lot" className="flex max-w-3xl flex-col items-start gap-3">
      <Outcome state={state} />
      <input type="hidden" name="lotId" value={lotId} />
      <input type="hidden" name="method" value="chosen" />
      <input type="hidden" name="positions" value={Array.from({ length: lotSize }, (_, k) => k + 1).join(" ")} />
      <p className="text-sm">The plan inspects every cell of the lot, so nothing is drawn at random: the sample is tray positions 1 to {formatNumber(lotSize)}.</p>
      <Button type="submit" disabled={pending}>
        {pending ? "Recording…" : `Take all ${formatNumber(lotSize)} cells as the sample`}
      </Button>
    </form>
  );
}

/** Both ways to draw a lot's sample under its plan, or the whole lot when the plan inspects every cell. */
export function DrawSampleForm({ action, lotId, n, lotSize }: { action: Action; lotId: string; n: number; lotSize: number }) {
  if (n >= lotSize) return <WholeLot action={action} lotId={lotId} lotSize={lotSize} />;
  return (
    <div className="flex max-w-3xl flex-col gap-4">
      <RandomDraw action={action} lotId={lotId} n={n} lotSize={lotSize} />
      <ChosenDraw action={action} lotId={lotId} n={n} lotSize={lotSize} />
    </div>
  );
}
