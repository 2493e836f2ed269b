import { describe, expect, it } from "vitest";
import { createRunFinding, createStepFinding, decideVerdict, type Finding, type FindingOutcome } from "@/lib/conformance";

function findingOf(outcome: FindingOutcome, extra: Partial<Finding> = {}): Finding {
  return {
    ...createStepFinding(
      { stepId: "rest", cycle: 2 },
      { rule: "duration-within-limits", title: "Rest duration within its limits", expected: { text: "1 h to 4 h" }, observed: { text: "50 min" }, outcome, clause: "x" },
    ),
    ...extra,
  };
}

describe("decideVerdict", () => {
  const conforms = [{ criterionId: "rated-capacity", outcome: "conforms" as const, cycle: 1, statement: "Measured 3.1 Ah: conforms." }];

  it("says yes when every finding meets, and keeps the specimen's statement apart", () => {
    const verdict = decideVerdict({ findings: [findingOf("meets"), findingOf("meets")], conformity: conforms, otherVersionNote: null });
    expect(verdict).toMatchObject({ procedureFollowed: "yes", specimenConforms: "conforms", beyondRating: false });
    expect(verdict.reasons).toContain("Procedure followed: all 2 checks meet.");
  });

  it("says no when a finding deviates, naming it, even if the specimen conforms", () => {
    const verdict = decideVerdict({ findings: [findingOf("meets"), findingOf("deviates"), findingOf("not assessable")], conformity: conforms, otherVersionNote: null });
    expect(verdict).toMatchObject({ procedureFollowed: "no", specimenConforms: "conforms" });
    expect(verdict.reasons).toContain('Deviates — step "rest", cycle 2: Rest duration within its limits — expected 1 h to 4 h; observed 50 min');
  });

  it("leaves it undecided when something could not be assessed and nothing deviates", () => {
    expect(decideVerdict({ findings: [findingOf("meets"), findingOf("not assessable")], conformity: conforms, otherVersionNote: null }).procedureFollowed).toBe("not decided");
  });

  it("combines the four outcomes of ILAC-G8:09/2019 4.2.3 least favourable first", () => {
    const of = (...outcomes: ("conforms" | "conditional pass" | "conditional fail" | "does not conform" | "not decided")[]) =>
      decideVerdict({ findings: [], conformity: outcomes.map((outcome, k) => ({ criterionId: `c${k}`, outcome, cycle: 1, statement: "" })), otherVersionNote: null }).specimenConforms;
    expect(of("conforms", "conditional pass")).toBe("conditional pass");
    expect(of("conditional pass", "not decided")).toBe("not decided");
    expect(of("not decided", "conditional fail")).toBe("conditional fail");
    expect(of("conditional fail", "does not conform", "conforms")).toBe("does not conform");
    expect(of("conforms", "conforms")).toBe("conforms");
  });

  it("combines criteria conservatively and states nothing without one", () => {
    const mixed = [...conforms, { criterionId: "time", outcome: "not decided" as const, cycle: 1, statement: "" }];
    expect(decideVerdict({ findings: [], conformity: mixed, otherVersionNote: null }).specimenConforms).toBe("not decided");
    const failing = [...mixed, { criterionId: "r", outcome: "does not conform" as const, cycle: 1, statement: "" }];
    expect(decideVerdict({ findings: [], conformity: failing, otherVersionNote: null }).specimenConforms).toBe("does not conform");
    const none = decideVerdict({ findings: [], conformity: [], otherVersionNote: null });
    expect(none.specimenConforms).toBe("not decided");
    expect(none.reasons.join(" ")).toContain("no acceptance criterion");
  });

  it("marks a run beyond the rating and a re-evaluation against another version", () => {
    const beyond = createRunFinding({ rule: "procedure-resolved", title: "t", expected: { text: "" }, observed: { text: "" }, outcome: "meets", clause: "", beyondRating: true });
    const verdict = decideVerdict({ findings: [beyond], conformity: conforms, otherVersionNote: "Re-evaluated against version 3." });
    expect(verdict.beyondRating).toBe(true);
    expect(verdict.reasons[0]).toBe("Re-evaluated against version 3.");
    expect(verdict.reasons.at(-1)).toContain("Outside the cell's rating: the run");
  });
});
