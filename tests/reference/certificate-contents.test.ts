import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { hashCanonicalJson } from "@/lib/certificates/canonical-json";
import { formatCelsius, formatMah, formatWh } from "@/lib/certificates/certificate-format";
import type { CertificatePayload } from "@/lib/certificates/certificate-payload";
import { renderCertificatePdf } from "@/lib/certificates/render-certificate";
import type { DischargeCurve } from "@/lib/certificates/vq-plot";
import { buildRunCertificatePayload } from "@/lib/certificates/build-run-payload";
import { buildFixturePayload, buildFixtureRecords } from "@/scenarios/run-certificate";
import { buildLotFixturePayload } from "../unit/certificates/fixture-lot-payload";

// What a test report must state: ISO/IEC 17025:2017 7.8.2.1 a–p, 7.8.3.1 and 7.8.8, as docs/references.md §8
// lists them [published]. The text is read back with Debian's pdftotext (poppler-utils), page by page.
const dir = mkdtempSync(join(tmpdir(), "cellwright-certificate-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function renderPages(payload: CertificatePayload, curves: DischargeCurve[], name: string): Promise<{ pages: string[]; file: string }> {
  const pdf = await renderCertificatePdf({ payload, payloadSha256: hashCanonicalJson(payload), curves, checkUrl: `http://localhost:3000/check/${payload.number}`, signingSubject: "Harbourside Cell Test Laboratory" });
  const file = join(dir, `${name}.pdf`);
  writeFileSync(file, pdf);
  const text = execFileSync("pdftotext", ["-raw", "-enc", "UTF-8", file, "-"], { encoding: "utf8" });
  // pdftotext ends every page with a form feed; no-break spaces read as spaces.
  const pages = text.replace(/\u00a0/g, " ").split("\f").slice(0, -1);
  return { pages, file };
}

const squash = (s: string) => s.replace(/\s+/g, " ");

describe("certificate contents (ISO/IEC 17025:2017 7.8.2.1, 7.8.3.1, 7.8.8)", async () => {
  const { payload, curves } = buildFixturePayload();
  const { pages, file } = await renderPages(payload, curves, "full");
  const all = squash(pages.join("\n"));

  it("is a paged A4 document whose every page carries the certificate's number and 'page x of y', and the last ends clearly (7.8.2.1 c)", () => {
    expect(pages.length).toBeGreaterThanOrEqual(2);
    pages.forEach((page, i) => {
      expect(page).toContain("C-00042");
      expect(squash(page)).toContain(`page ${i + 1} of ${pages.length}`);
    });
    expect(squash(pages.at(-1)!)).toContain("End of certificate C-00042");
    expect(pages.slice(0, -1).some((p) => p.includes("End of certificate"))).toBe(false);
    expect(execFileSync("pdfinfo", [file], { encoding: "utf8" })).toMatch(/Page size:\s+595\.28 x 841\.89 pts \(A4\)/);
  });

  it("embeds the shipped Merriweather font for its text", () => {
    const fonts = execFileSync("pdffonts", [file], { encoding: "utf8" });
    expect(fonts).toMatch(/Merriweather-Regular\s+CID TrueType\s+Identity-H\s+yes\s+yes\s+yes/);
    expect(fonts).toMatch(/Merriweather-Bold/);
  });

  it("states the title, the lab's name and address, the place of the work and the customer (a, b, d)", () => {
    expect(all).toContain("Test certificate");
    expect(all).toContain("Harbourside Cell Test Laboratory");
    expect(all).toContain("Unit 4, 17 Ropewalk Lane, Portmere PM3 9QX");
    expect(all).toMatch(/Place of the work\s+At the laboratory's premises/);
    expect(all).toMatch(/Customer\s+Quayside Packs Ltd/);
  });

  it("identifies the method, the item, its condition, receipt, the dates of testing and of issue, and sampling (e, f, g, h, i, k)", () => {
    expect(all).toMatch(/Procedure\s+TPL-RC20 version 2: Rated capacity at 20 °C/);
    expect(all).toMatch(/Standard and clause\s+IEC 61960-3:2017, 7\.2, 7\.3\.1/);
    expect(all).toMatch(/Specimen\s+SP-0042/);
    expect(all).toContain("Testmoor Cells TM-21700-30, INR22/71, NMC");
    expect(all).toMatch(/Condition on receipt\s+intact, no dents, open-circuit voltage 3\.48 V/);
    expect(all).toMatch(/Date of receipt\s+2026-02-26/);
    // 7.8.2.1 i [published] with issue 12, 7a: the dates of testing are the data log's first and last sample.
    expect(all).toMatch(/Dates of testing\s+2026-03-02T08:00Z to 2026-03-02T\d\d:\d\dZ, from the data log's first and last sample \(the log's own timestamps\)/);
    expect(all).not.toContain("Step sheet"); // the step sheet's times agree with the log here
    expect(all).toMatch(/Date of issue\s+2026-03-04T09:30Z/);
    expect(all).toMatch(/Sampling\s+Not applicable/);
  });

  it("gives results with units, the V–Q plot, and the deviations from the method with the reviewer's note (m, n)", () => {
    const measured = payload.results.find((r) => r.stepId === "discharge")!;
    expect(all).toContain(formatMah(measured.capacityMAh).replace(/\u00a0/g, " "));
    expect(all).toContain(formatWh(measured.energyWh).replace(/\u00a0/g, " "));
    expect(all).toMatch(/\d\.\d\d V/);
    expect(all).toContain("Charge delivered (mAh)");
    expect(all).toContain("Voltage (V)");
    expect(all).toContain("Figure 1: Capacity discharge at 0.2 It");
    expect(all).toContain("Deviations from the method");
    expect(all).toContain("Rest after charge: Ambient temperature within its range");
    expect(all).toContain("Reviewer's note: Door of the climate cabinet left open");
  });

  it("states that results relate only to the item tested, that no result is from an external provider, and who reviewed and authorised it, when and meaning what (h, o, p; 7.8.1)", () => {
    expect(all).toContain("The results relate only to the item tested");
    expect(all).toContain("No result on this certificate comes from an external provider");
    expect(all).toMatch(/Reviewed by .*Rhea Okafor/);
    expect(all).toMatch(/Approved for issue by .*Tomas Lindqvist/);
    expect(all).toContain("2026-03-04T08:12Z");
    expect(all).toContain("Meaning: reviewed (checked the records, findings and results against the procedure)");
    expect(all).toContain("Meaning: approved (authorised the certificate for issue)");
    expect(all).toContain("http://localhost:3000/check/C-00042");
  });

  it("gives the test conditions, the statement of conformity with its decision rule, and the uncertainty (7.8.3.1 a–c)", () => {
    expect(all).toContain("Test conditions: ambient temperature");
    expect(all).toContain(`${formatCelsius(15).replace(/\u00a0/g, " ")} to ${formatCelsius(25).replace(/\u00a0/g, " ")}`);
    expect(all).toContain("22.4 °C to 26.5 °C (3 readings)");
    expect(all).toMatch(/Conforms — statement of conformity of specimen SP-0042/);
    // ILAC-G8:09/2019 4.2.1 [published, clause checked against a public copy]: the rule is named with its clause.
    expect(all).toMatch(/Decision rule\s+Simple acceptance \(binary statement, guard band w = 0\) \(ILAC-G8:09\/2019 4\.2\.1\)/);
    expect(all).toMatch(/under the decision rule simple acceptance \(binary statement, guard band w = 0\) \(ILAC-G8:09\/2019 4\.2\.1\)/);
    const capacity = payload.uncertainty.find((u) => u.quantity === "capacity")!.budget;
    expect(all).toContain(`U = ±${formatMah(capacity.expandedUncertainty * 1000).replace(/\u00a0/g, " ")}`);
    expect(all).toContain("sqrt 3");
    expect(all).not.toContain("Uncertainty not evaluated");
  });

  it("says 'uncertainty not evaluated' when the evaluation carried no budget", async () => {
    const bare = buildFixturePayload({ uncertainty: false });
    const text = squash((await renderPages(bare.payload, bare.curves, "bare")).pages.join("\n"));
    expect(text).toContain("Uncertainty not evaluated");
  });

  it("names the certificate an amendment replaces, and why (7.8.8)", async () => {
    const amended = buildFixturePayload();
    amended.payload.replaces = { number: "C-00041", reason: "Customer's legal name corrected" };
    const text = squash((await renderPages(amended.payload, amended.curves, "amended")).pages.join("\n"));
    expect(text).toContain("Amendment: this certificate replaces certificate C-00041, which is withdrawn.");
    expect(text).toContain("Reason: Customer's legal name corrected");
  });
});

// A lot certificate adds the sampling plan (7.8.2.1 k) and the lot decision. The plan of a lot of 60
// at general inspection level II, AQL 1.0, is code letter E, n = 13, Ac 0, Re 1: docs/references.md §10
// [published: ISO 2859-1 Table 1 and Table 2-A].
describe("lot certificate contents (ISO/IEC 17025:2017 7.8.2.1 with the sampling plan; ISO 2859-1)", async () => {
  const accepted = await renderPages(buildLotFixturePayload(), [], "lot");
  const all = squash(accepted.pages.join("\n"));

  it("carries its number and 'page x of y' on every page and ends clearly", () => {
    expect(accepted.pages.length).toBeGreaterThanOrEqual(2);
    accepted.pages.forEach((page, i) => {
      expect(page).toContain("C-00077");
      expect(squash(page)).toContain(`page ${i + 1} of ${accepted.pages.length}`);
    });
    expect(squash(accepted.pages.at(-1)!)).toContain("End of certificate C-00077");
    expect(accepted.pages.slice(0, -1).some((p) => p.includes("End of certificate"))).toBe(false);
  });

  it("states the sampling plan: standard, level, AQL, code letter, n, Ac and Re, and how they follow", () => {
    expect(all).toContain("Lot certificate");
    expect(all).toMatch(/Standard ISO 2859-1:1999, Table 1 and Table 2-A/);
    expect(all).toMatch(/general inspection level II, AQL 1\.0 % nonconforming, normal inspection/);
    expect(all).toMatch(/Code letter E/);
    expect(all).toMatch(/Sample size n 13 cells/);
    expect(all).toMatch(/Acceptance number Ac 0/);
    expect(all).toMatch(/Rejection number Re 1/);
    expect(all).toContain("lot of 60 at level II -> code letter E (Table 1)");
  });

  it("states the lot, the customer, the draw, each drawn cell's run and result, and the lot decision with its rule", () => {
    expect(all).toMatch(/Customer Quayside Packs Ltd/);
    expect(all).toMatch(/Quantity received 60 cells \(the lot size\)/);
    expect(all).toMatch(/Date of receipt 2026-03-02/);
    expect(all).toContain("drawn at random by Tomas Lindqvist with seed 2026");
    expect(all).toMatch(/41 L-2026-021-41 R-00100 C-00070 3 061 mAh/);
    expect(all).toContain("Lot accepted — 0 nonconforming of 13 tested is within the acceptance number 0: accept.");
    expect(all).toMatch(/Rule Single sampling \(ISO 2859-1\): test 13 specimens; accept the lot with 0 or fewer nonconforming, reject it with 1 or more/);
    expect(all).toMatch(/Cells judged under Simple acceptance \(binary statement, guard band w = 0\) \(ILAC-G8:09\/2019 4\.2\.1\)/);
    // Issue 12, 6: ISO 2859-1's switching rules and its series-of-lots basis [published: the standard's scope], and
    // ISO 2859-2 named for a lot in isolation (not implemented).
    expect(all).toMatch(/Use of ISO 2859-1 The sampling plan is an ISO 2859-1 single sampling plan at normal inspection\. The switching rules of ISO 2859-1 \(to tightened or reduced inspection\) were not applied, and the plan's AQL assumes a continuing series of lots\./);
    expect(all).toContain("For a lot in isolation, ISO 2859-2 (plans indexed by limiting quality) is the applicable approach; it is not implemented in this software");
  });

  it("states the 0.2 It statistics with Cpl and its formula, that the decision rests on the sample, and who authorised it", () => {
    expect(all).toMatch(/Mean 3 033 mAh/);
    expect(all).toContain("Cpl = (mean − LSL) / (3 s)");
    expect(all).toContain("The lot decision rests on the sample");
    expect(all).toContain("The results relate only to the cells tested");
    expect(all).toMatch(/Approved for issue by .*Rhea Okafor/);
    expect(all).toContain("Meaning: approved (authorised the certificate for issue)");
    expect(all).toContain("http://localhost:3000/check/C-00077");
  });

  it("states a rejected lot as rejected, naming the nonconforming cell", async () => {
    const rejected = squash((await renderPages(buildLotFixturePayload({ nonconforming: true }), [], "lot-rejected")).pages.join("\n"));
    expect(rejected).toContain("Lot rejected — 1 nonconforming of 13 tested reaches the rejection number 1: reject.");
    expect(rejected).toMatch(/does not conform — tray position 33, specimen L-2026-021-33, run R-00102/);
  });
});

// Issue 12, 7: a certificate states only what happened. Dates of testing (ISO/IEC 17025:2017 7.8.2.1 i [published])
// from the data log's own time span, with the step sheet's beside it where they differ; the set-point current of each
// measured step in A and as a multiple of It (It = Cn / 1 h, IEC 61434 [published], docs/references.md §1); one timestamp
// form, ISO 8601 with its zone.
describe("certificate contents: what happened (issue 12, 7a, 7b, 7e)", async () => {
  const { records, curves } = buildFixtureRecords();
  const shift = (iso: string | undefined) => (iso === undefined ? undefined : new Date(Date.parse(iso) + 30 * 60_000).toISOString());
  const stepRecords = records.stepRecords.map((r) => ({
    ...r,
    ...(r.startedAt && { startedAt: shift(r.startedAt) }),
    ...(r.endedAt && { endedAt: shift(r.endedAt) }),
    ambientReadings: r.ambientReadings.map((a) => ({ ...a, at: shift(a.at) ?? a.at })),
    // The capacity discharge programmed at 3 It (9 A on a 3 000 mAh cell) where the procedure says 0.2 It.
    programmed: r.stepId === "discharge" ? { ...r.programmed, current: 9 } : r.programmed,
  }));
  const payload = buildRunCertificatePayload({ ...records, stepRecords });
  const all = squash((await renderPages(payload, curves, "what-happened")).pages.join("\n"));

  it("dates testing from the data log's first and last sample, and shows the step sheet's differing times beside them", () => {
    expect(payload.testing).toMatchObject({ from: "2026-03-02T08:00:00.000Z", source: expect.stringContaining("data log's first and last sample") });
    expect(payload.testing.stepSheet?.from).toBe("2026-03-02T08:30:00.000Z");
    expect(all).toMatch(/Dates of testing\s+2026-03-02T08:00Z to 2026-03-02T\d\d:\d\dZ, from the data log's first and last sample/);
    expect(all).toMatch(/Step sheet\s+2026-03-02T08:30Z to 2026-03-02T\d\d:\d\dZ: the times the operator recorded, which differ from the data log's/);
  });

  it("states the set-point current of each measured step in A and as a multiple of It: a run programmed at 3 It says 3 It", () => {
    const discharge = payload.results.find((r) => r.stepId === "discharge");
    expect(discharge?.setPoints).toEqual([{ name: "current", currentA: 9, itMultiple: 3, from: "as programmed" }]);
    expect(all).toContain("set-point 9.000 A = 3 It, as programmed");
    expect(all).toContain("set-point 1.500 A = 0.5 It, as programmed");
  });

  it("writes every moment one way, ISO 8601 with its zone (no 'UTC' words, no seconds or fractions)", () => {
    expect(all).not.toMatch(/\bUTC\b/);
    expect(all).not.toMatch(/T\d\d:\d\d:\d\d/);
    expect(all.match(/\d{4}-\d{2}-\d{2}T\d{2}:\d{2}Z/g)?.length).toBeGreaterThanOrEqual(6);
  });
});
