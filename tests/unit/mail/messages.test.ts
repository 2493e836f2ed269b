import { afterEach, describe, expect, it } from "vitest";
import { composeCalibrationDue, composeRunSubmitted } from "@/lib/mail/messages";

const saved = process.env.CELLWRIGHT_PUBLIC_URL;
afterEach(() => {
  if (saved === undefined) delete process.env.CELLWRIGHT_PUBLIC_URL;
  else process.env.CELLWRIGHT_PUBLIC_URL = saved;
});

describe("composeCalibrationDue", () => {
  const base = { instrument: "cycler channel CY1-CH02", dueOn: "2026-12-20", instrumentId: "abc" };

  it("names the due date in the subject and counts the days left in the body", () => {
    const soon = composeCalibrationDue({ ...base, daysLeft: 18 });
    expect(soon.subject).toBe("Calibration of cycler channel CY1-CH02 due on 2026-12-20");
    expect(soon.body).toContain("is due on 2026-12-20, in 18 days");
    expect(composeCalibrationDue({ ...base, daysLeft: 1 }).body).toContain("in 1 day.");
    expect(composeCalibrationDue({ ...base, daysLeft: 0 }).body).toContain("is due today (2026-12-20)");
  });

  it("says overdue once the date has passed", () => {
    const late = composeCalibrationDue({ ...base, daysLeft: -3 });
    expect(late.subject).toBe("Calibration of cycler channel CY1-CH02 overdue (was due on 2026-12-20)");
    expect(late.body).toContain("was due on 2026-12-20");
  });

  it("links to where the new calibration is recorded, at the lab's public address", () => {
    process.env.CELLWRIGHT_PUBLIC_URL = "https://lab.example/";
    expect(composeCalibrationDue({ ...base, daysLeft: 5 }).body).toContain("https://lab.example/instruments/abc/edit");
  });
});

describe("composeRunSubmitted", () => {
  it("names the run, the operator and the procedure", () => {
    process.env.CELLWRIGHT_PUBLIC_URL = "http://localhost:3100";
    const m = composeRunSubmitted({ runNumber: "R-00007", runId: "r7", specimen: "KV48-A-002", procedure: "TPL-RC20 v1", operatorName: "Priya Raman" });
    expect(m.subject).toBe("Run R-00007 submitted for review");
    expect(m.body).toContain("Priya Raman submitted run R-00007 (TPL-RC20 v1 on specimen KV48-A-002)");
    expect(m.body).toContain("http://localhost:3100/runs/r7");
  });
});
