import { describe, expect, it } from "vitest";
import { checkNextPart } from "@/lib/runs/log-parts/part-sequence";
import { ENDURANCE_LOG_HEADER, enduranceLogPlan, formatEnduranceLogPart } from "@/scenarios/endurance-log";

const plan = { ...enduranceLogPlan, cycles: 12, sampleIntervalS: 30, fadePerCycle: 0.008, pulseEveryCycles: 5 };
const rows = (csv: string) => csv.trimEnd().split("\n").slice(1);
const span = (csv: string, number: number) => {
  const r = rows(csv);
  return { number, firstS: Number(r[0]!.split(",")[0]), lastS: Number(r.at(-1)!.split(",")[0]), samples: r.length, header: ENDURANCE_LOG_HEADER.split(",") };
};

// The invented cycler's files (demo and e2e) must be the log cut in pieces: nothing lost, nothing twice.
describe("an endurance log written in parts", () => {
  it("gives, part after part, exactly the rows of the whole log", () => {
    const whole = formatEnduranceLogPart(plan, 1, 12);
    const parts = [formatEnduranceLogPart(plan, 1, 4), formatEnduranceLogPart(plan, 5, 5), formatEnduranceLogPart(plan, 6, 12)];
    for (const p of parts) expect(p.startsWith(`${ENDURANCE_LOG_HEADER}\n`)).toBe(true);
    expect(parts.flatMap(rows).join("\n")).toBe(rows(whole).join("\n"));
  });

  it("fits each part after the one before, and refuses one that starts inside it as an overlap", () => {
    const [a, b] = [span(formatEnduranceLogPart(plan, 1, 4), 1), span(formatEnduranceLogPart(plan, 5, 8), 2)];
    expect(checkNextPart(a, b, "elapsed")).toEqual({ ok: true, gapS: null });
    const overlap = span(formatEnduranceLogPart(plan, 7, 10), 3);
    const fit = checkNextPart(b, overlap, "elapsed");
    expect(fit.ok).toBe(false);
    expect(!fit.ok && fit.problem).toMatch(/^This part overlaps part 2: it starts at .* elapsed, but part 2 runs until .* elapsed\./);
  });

  it("refuses a range that is no range", () => {
    expect(() => formatEnduranceLogPart(plan, 3, 2)).toThrow("no range");
  });
});
