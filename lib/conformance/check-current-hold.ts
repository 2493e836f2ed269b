import type { IndexRange, LogColumns } from "@/lib/analysis";
import { assertNever, formatNumber, type ResolvedSetPoint } from "@/protocols";
import type { Finding, FindingDraft } from "./finding";
import { citeProcedure, citeTolerance, commonPractice, formatPercent, formatRange, formatValue } from "./format-value";
import { explainTooSlowForPulse } from "./check-pulse-timing";
import { createFinding, explainMissingLog, type StepContext } from "./step-context";
import { createBand, isInsideBand, type Band } from "./tolerance-band";

interface Excursions {
  meanA: number;
  samples: number;
  outside: number;
  /** Time spent outside the band: each outside sample stands for the interval up to the next sample, s. */
  outsideS: number;
  /** The longest unbroken run outside the band, s. */
  longestS: number;
}

/** Mean |I| over a range, and how many samples and how much time fall outside the band. */
function measureExcursions(columns: LogColumns, range: IndexRange, band: Band): Excursions {
  const { currentA: c, timeS: t } = columns;
  let sum = 0;
  let outside = 0;
  let outsideS = 0;
  let runS = 0;
  let longestS = 0;
  for (let i = range.from; i <= range.to; i++) {
    const magnitude = Math.abs(c[i] as number);
    sum += magnitude;
    // The last sample of the range stands for the interval before it (there is no next one inside).
    const weight = i < range.to ? (t[i + 1] as number) - (t[i] as number) : i > range.from ? (t[i] as number) - (t[i - 1] as number) : 0;
    if (isInsideBand(magnitude, band)) {
      runS = 0;
      continue;
    }
    outside++;
    outsideS += weight;
    runS += weight;
    if (runS > longestS) longestS = runS;
  }
  const samples = range.to - range.from + 1;
  return { meanA: sum / samples, samples, outside, outsideS, longestS };
}

interface HoldCheck {
  field: string;
  words: string;
  target: ResolvedSetPoint;
}

function draftHold(context: StepContext, check: HoldCheck, band: Band | null): Omit<FindingDraft, "observed" | "outcome"> {
  const tolerance = context.step.tolerances.currentPercent;
  const allowed = context.settings.currentExcursionAllowanceS;
  return {
    rule: "current-held",
    field: check.field,
    title: `${check.words[0]?.toUpperCase()}${check.words.slice(1)} held within tolerance`,
    expected:
      band === null || check.target === null
        ? { text: "the set-point is not resolved, so there is nothing to compare with", unit: "A" }
        : {
            text:
              `${formatValue(check.target.value, "A")} ${formatPercent(tolerance.value)} (${formatRange(band, "A")}) over the constant-current part, ` +
              `at most ${formatValue(allowed, "s")} in total outside it (switching transients)`,
            value: check.target.value,
            ...band,
            unit: "A",
          },
    clause: `${citeProcedure(context.citation, check.words)}; ${citeTolerance(tolerance)}; time outside: our own allowance for switching transients, ${commonPractice}`,
  };
}

/** A constant current held over a range of the log: mean and nearly every sample within the band. */
function checkHeldOver(context: StepContext, check: HoldCheck, range: () => IndexRange | { outcome: "deviates" | "not assessable"; reason: string }): Finding {
  const band = check.target === null ? null : createBand(check.target.value, context.step.tolerances.currentPercent.value);
  const draft = draftHold(context, check, band);
  const missing = explainMissingLog(context.evidence);
  if (missing !== null || band === null || context.evidence.kind !== "found") {
    return createFinding(context, { ...draft, observed: { text: missing ?? "no set-point" }, outcome: "not assessable" });
  }
  const span = range();
  if ("reason" in span) return createFinding(context, { ...draft, observed: { text: span.reason }, outcome: span.outcome });
  const { meanA, samples, outside, outsideS, longestS } = measureExcursions(context.evidence.columns, span, band);
  const held = isInsideBand(meanA, band) && outsideS <= context.settings.currentExcursionAllowanceS;
  const excursions =
    outside === 0
      ? "none outside the tolerance"
      : `${formatNumber(outside)} outside the tolerance for ${formatValue(outsideS, "s")} in total (longest ${formatValue(longestS, "s")})`;
  return createFinding(context, {
    ...draft,
    observed: {
      text: `mean ${formatValue(meanA, "A")} over ${formatNumber(samples)} samples, ${excursions}`,
      value: meanA,
      unit: "A",
    },
    outcome: held ? "meets" : "deviates",
  });
}

/** The two levels of a pulse step, each mean against its set-point. */
function checkPulseLevels(context: StepContext, checks: { base: HoldCheck; pulse: HoldCheck }): Finding[] {
  const { evidence } = context;
  return (["base", "pulse"] as const).map((level) => {
    const check = checks[level];
    const band = check.target === null ? null : createBand(check.target.value, context.step.tolerances.currentPercent.value);
    const draft = draftHold(context, check, band);
    const missing = explainMissingLog(evidence);
    if (missing !== null || band === null || evidence.kind !== "found") {
      return createFinding(context, { ...draft, observed: { text: missing ?? "no set-point" }, outcome: "not assessable" });
    }
    if (evidence.dcResistance === null) {
      // A log sampled too slowly to show the pulse cannot tell whether it was held (issue 12, 3d).
      const tooSlow = context.step.kind === "pulse" ? explainTooSlowForPulse(context.step, evidence.columns, evidence.phase) : null;
      if (tooSlow !== null) return createFinding(context, { ...draft, observed: { text: tooSlow }, outcome: "not assessable" });
      return createFinding(context, { ...draft, observed: { text: "no two-level pulse was found in the logged phase" }, outcome: "deviates" });
    }
    const meanA = Math.abs(level === "base" ? evidence.dcResistance.baseMeanCurrentA : evidence.dcResistance.pulseMeanCurrentA);
    return createFinding(context, {
      ...draft,
      observed: { text: `mean ${formatValue(meanA, "A")} over the ${level} level`, value: meanA, unit: "A" },
      outcome: isInsideBand(meanA, band) ? "meets" : "deviates",
    });
  });
}

/**
 * The logged current held the resolved set-point within the current tolerance (IEC 61960-3
 * clause 4: ±1 %, docs/references.md §3) over the constant-current part: a charge's CC part, a whole
 * discharge, each level of a pulse. The current may stray for a few seconds in total (switching
 * transients); how long is a setting in seconds, not a value from the standard.
 */
export function checkCurrentHold(context: StepContext): Finding[] {
  const { step, evidence } = context;
  switch (step.kind) {
    case "charge":
      return [
        checkHeldOver(context, { field: "current", words: "charge current", target: step.current }, () => {
          if (evidence.kind !== "found" || evidence.phase.kind !== "charge" || evidence.phase.constantCurrent === null) {
            return { outcome: "not assessable", reason: "the logged charge has no constant-current part" };
          }
          return evidence.phase.constantCurrent;
        }),
      ];
    case "discharge":
      return [
        checkHeldOver(context, { field: "current", words: "discharge current", target: step.current }, () => {
          if (evidence.kind !== "found") return { outcome: "not assessable", reason: "no log phase" };
          const { phase } = evidence;
          if (phase.kind === "discharge" && phase.pulse !== null) {
            return {
              outcome: "deviates",
              reason: `the logged discharge changes level: ${formatValue(Math.abs(phase.pulse.baseMeanCurrentA), "A")}, then ${formatValue(Math.abs(phase.pulse.pulseMeanCurrentA), "A")}`,
            };
          }
          return phase;
        }),
      ];
    case "pulse":
      return checkPulseLevels(context, {
        base: { field: "baseCurrent", words: "base current", target: step.baseCurrent },
        pulse: { field: "pulseCurrent", words: "pulse current", target: step.pulseCurrent },
      });
    case "rest":
    case "soak":
    case "measure":
    case "observe":
    // A cycle block is judged cycle by cycle from the log in evaluate-endurance.ts.
    case "cycle-block":
      return [];
    default:
      return assertNever(step);
  }
}
