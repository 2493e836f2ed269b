import { describe, expect, it } from "vitest";
import { instrumentInputSchema } from "@/lib/instruments/instrument-input";
import { lotInputSchema } from "@/lib/lots/lot-input";
import { specimenInputSchema } from "@/lib/specimens/specimen-input";

function messagesAt(result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }, field: string): string[] {
  return (result.error?.issues ?? []).filter((i) => i.path.join(".") === field).map((i) => i.message);
}

// Issue 11 row 13: a 121-character supplier was refused as "required" (the schema's catch-all message).
describe("refusals give the real reason", () => {
  it("a too-long supplier, a too-large lot", () => {
    const r = lotInputSchema.safeParse({ identifier: "LOT-1", supplier: "x".repeat(121), quantityReceived: 20_000_000, receivedOn: "2026-12-01" });
    expect(messagesAt(r, "supplier")).toEqual(["The supplier's name has at most 120 characters."]);
    expect(messagesAt(r, "quantityReceived")).toEqual(["A lot holds at most 10 000 000 cells."]);
  });

  it("a too-long condition on receipt", () => {
    const r = specimenInputSchema.safeParse({ conditionOnReceipt: "y".repeat(501) });
    expect(messagesAt(r, "conditionOnReceipt")).toEqual(["Describe the condition in at most 500 characters."]);
  });

  it("too-long serial and calibration certificate numbers", () => {
    const r = instrumentInputSchema.safeParse({ serial: "s".repeat(101), calibrationCertificate: "c".repeat(101) });
    expect(messagesAt(r, "serial")).toEqual(["The serial number has at most 100 characters."]);
    expect(messagesAt(r, "calibrationCertificate")).toEqual(["The calibration certificate number has at most 100 characters."]);
  });

  it("still says required when the field is missing", () => {
    expect(messagesAt(lotInputSchema.safeParse({}), "supplier")).toEqual(["required"]);
  });
});
