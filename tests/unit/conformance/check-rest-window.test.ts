import { describe, expect, it } from "vitest";
import { checkDurations, checkOrderAndGap, checkRestWindow, findTimeSpan, type PlacedStep } from "@/lib/conformance";
import { contextOf, evidenceOf, levelOf, logOf, recordOf, steps } from "./context-fixtures";

/**
 * A synthetic log sampled every 10 s: a 1 h charge at 1.5 A, then no samples for `pauseS` (the cycler
 * paused), then a rest at 0 A for `restS`, then a discharge at 0.6 A for 1 h.
 */
function chargePauseRestDischarge(pauseS: number, restS: number) {
  const charge = levelOf(361, (k) => 3.7 + k * 0.001, 1.5);
  const rest = levelOf(restS / 10 + 1, 4.15, 0);
  const discharge = levelOf(361, (k) => 4.1 - k * 0.001, -0.6);
  const times = [
    ...charge.map((_, k) => k * 10),
    ...rest.map((_, k) => 3600 + pauseS + k * 10),
    ...discharge.map((_, k) => 3600 + pauseS + restS + 10 + k * 10),
  ];
  return logOf([...charge, ...rest, ...discharge], times);
}

function placeOnLog(columns: ReturnType<typeof logOf>, pauseReason?: string): [PlacedStep, PlacedStep, PlacedStep] {
  const ids = ["charge", "rest", "discharge"] as const;
  return ids.map((id, phaseIndex) => {
    const context = contextOf({
      step: steps[id],
      record: recordOf({ stepId: id, ...(id === "rest" && pauseReason !== undefined && { pauseReason }) }),
      evidence: evidenceOf(columns, { phaseIndex }),
    });
    return { context, span: findTimeSpan(context) };
  }) as [PlacedStep, PlacedStep, PlacedStep];
}

describe("checkRestWindow (issue 12, 3a): pauses count inside the window the longest rest limits", () => {
  it("a 30 min explained pause before a 3 h 50 min rest: the rest alone met 1 h to 4 h; the window of 4 h 20 min deviates", () => {
    const [charge, rest, discharge] = placeOnLog(chargePauseRestDischarge(1800, 13_800), "climate chamber door alarm");
    // Before: the rest's own duration met its limits, and the explained pause met too.
    expect(checkDurations(rest.context)[0]).toMatchObject({ rule: "duration-within-limits", outcome: "meets", observed: { value: 13_800 } });
    // Now the pause itself is a deviation with its reason …
    expect(checkOrderAndGap({ previous: charge, current: rest })).toMatchObject({ outcome: "deviates", observed: { value: 1800 } });
    // … and the charge → discharge window (rest limit 4 h × 1.001 = 14 414.4 s) deviates.
    const [window] = checkRestWindow({ current: rest, previous: charge, next: discharge });
    expect(window).toMatchObject({ rule: "rest-window-within-limit", outcome: "deviates", expected: { max: 14_414.4 } });
    expect(window?.observed.value).toBe(15_610);
    expect(window?.observed.text).toContain("pause reasons recorded: climate chamber door alarm");
  });

  it("meets when rest and pauses together stay within the longest rest", () => {
    const [charge, rest, discharge] = placeOnLog(chargePauseRestDischarge(600, 7200));
    const [window] = checkRestWindow({ current: rest, previous: charge, next: discharge });
    expect(window).toMatchObject({ outcome: "meets", observed: { value: 7810 } });
  });

  it("applies to rests and soaks with a longest time only, after some step", () => {
    const [charge, rest, discharge] = placeOnLog(chargePauseRestDischarge(600, 7200));
    expect(checkRestWindow({ current: discharge, previous: rest, next: undefined })).toEqual([]);
    expect(checkRestWindow({ current: rest, previous: undefined, next: discharge })).toEqual([]);
    const open = { ...rest, context: { ...rest.context, step: { ...steps.rest, maxDuration: undefined } } } as PlacedStep;
    expect(checkRestWindow({ current: open, previous: charge, next: discharge })).toEqual([]);
  });
});
