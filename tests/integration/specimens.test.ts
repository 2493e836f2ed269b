import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { translateConstraintError } from "@/db/constraint-errors";
import { getLot } from "@/db/lots";
import { getSpecimen, listSpecimens } from "@/db/specimens";
import { addDays } from "@/lib/instruments/calendar-date";
import { readLabToday } from "@/lib/instruments/lab-today";
import { createLot, editLot, lotInputSchema } from "@/lib/lots/lot-records";
import { createSpecimen, editSpecimen, specimenInputSchema } from "@/lib/specimens/specimens";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { cellSpecificationInputSchema } from "@/lib/specs/cell-specifications-input";
import { makeUser } from "./fixtures";

const today = readLabToday();
let n = 0;
const next = () => ++n;

async function makeSpecification(model: string): Promise<string> {
  const engineer = await makeUser("engineer", "Eve Engineer");
  return createCellSpecification(
    engineer,
    cellSpecificationInputSchema.parse({
      maker: "Testmoor Cells",
      model: `${model}-${next()}`,
      data: {
        chemistry: { positiveElectrode: "N", label: "NMC" },
        shape: "cylindrical",
        ratedCapacityMah: 3000,
        nominalVoltageV: 3.6,
        chargeVoltageV: 4.2,
        standardChargeCurrentA: 1.5,
        maxContinuousDischargeCurrentA: 10,
        endOfDischargeVoltageV: 2.5,
        maxDiameterMm: 18.4,
        maxHeightMm: 65.2,
      },
    }),
  );
}

const lotInput = (cellSpecificationId: string, quantityReceived = 50) =>
  lotInputSchema.parse({ identifier: `IT-LOT-${next()}`, cellSpecificationId, supplier: "Fernhollow Components", quantityReceived, receivedOn: addDays(today, -3), notes: "" });

const specimenInput = (cellSpecificationId: string, lotId: string | null) =>
  specimenInputSchema.parse({ identifier: `IT-CELL-${next()}`, cellSpecificationId, lotId, receivedOn: addDays(today, -2), conditionOnReceipt: "sleeve intact" });

const actionsOf = async (id: string) =>
  (await getDb().selectFrom("audit_event").select("action").where("entity_id", "=", id).orderBy("id").execute()).map((e) => e.action);

describe("lots and specimens", () => {
  it("registers and edits a lot and its specimens, each write with its audit event", async () => {
    const operator = await makeUser("operator", "Otto Operator");
    const spec = await makeSpecification("TM-A");
    const lotId = await createLot(operator, lotInput(spec));
    const first = specimenInput(spec, lotId);
    const specimenId = await createSpecimen(operator, first);
    await createSpecimen(operator, specimenInput(spec, lotId));
    await editSpecimen(operator, specimenId, { ...first, conditionOnReceipt: "sleeve scuffed", notes: "re-inspected" });
    const lot = await getLot(getDb(), lotId);
    await editLot(operator, lotId, { ...lotInput(spec), identifier: lot!.identifier, supplier: "Fernhollow Components Ltd" });

    expect(await getSpecimen(getDb(), specimenId)).toMatchObject({ conditionOnReceipt: "sleeve scuffed", notes: "re-inspected", lot: { id: lotId }, specification: { id: spec } });
    expect(await getLot(getDb(), lotId)).toMatchObject({ supplier: "Fernhollow Components Ltd", specimenCount: 2 });
    expect(await actionsOf(lotId)).toEqual(["lot.create", "lot.edit"]);
    expect(await actionsOf(specimenId)).toEqual(["specimen.create", "specimen.edit"]);
    const edit = await getDb().selectFrom("audit_event").select(["before", "after"]).where("entity_id", "=", specimenId).where("action", "=", "specimen.edit").executeTakeFirstOrThrow();
    expect(edit.before).toMatchObject({ conditionOnReceipt: "sleeve intact", notes: null, lot: lot!.identifier });
    expect(edit.after).toMatchObject({ conditionOnReceipt: "sleeve scuffed", notes: "re-inspected" });
    expect((await listSpecimens(getDb(), { lotId })).map((s) => s.id)).toContain(specimenId);
  });

  it("refuses, in the service, a specimen whose specification differs from its lot's; nothing is written", async () => {
    const operator = await makeUser("operator", "Otto Operator");
    const [specA, specB] = [await makeSpecification("TM-B"), await makeSpecification("TM-C")];
    const lotId = await createLot(operator, lotInput(specA));
    const wrong = specimenInput(specB, lotId);
    await expect(createSpecimen(operator, wrong)).rejects.toThrow(/holds Testmoor Cells TM-B-\d+ cells, not Testmoor Cells TM-C-\d+/);
    expect(await getDb().selectFrom("specimen").select("id").where("identifier", "=", wrong.identifier).execute()).toEqual([]);
    expect(await getDb().selectFrom("audit_event").select("id").where("action", "=", "specimen.create").where(sql`after->>'identifier'`, "=", wrong.identifier).execute()).toEqual([]);

    const loose = await createSpecimen(operator, specimenInput(specB, null));
    await expect(editSpecimen(operator, loose, { ...specimenInput(specB, lotId) })).rejects.toThrow(/a specimen of a lot is of the lot's cell specification/);
  });

  it("has the database refuse the same mismatch when the service is bypassed, and a lot's specification change under its specimens", async () => {
    const operator = await makeUser("operator", "Otto Operator");
    const [specA, specB] = [await makeSpecification("TM-D"), await makeSpecification("TM-E")];
    const lotId = await createLot(operator, lotInput(specA));
    const inserted = await getDb()
      .insertInto("specimen")
      .values({ identifier: "IT-RAW-1", cell_specification_id: specB, lot_id: lotId, received_on: today, condition_on_receipt: "ok", created_by: operator.id })
      .execute()
      .catch((e: unknown) => e);
    expect(translateConstraintError(inserted)?.message).toBe("specimen IT-RAW-1 is of another cell specification than its lot");

    const specimenId = await createSpecimen(operator, specimenInput(specA, lotId));
    const moved = await getDb().updateTable("specimen").set({ cell_specification_id: specB }).where("id", "=", specimenId).execute().catch((e: unknown) => e);
    expect(translateConstraintError(moved)?.code).toBe("conflict");

    const relabelled = await getDb().updateTable("lot").set({ cell_specification_id: specB }).where("id", "=", lotId).execute().catch((e: unknown) => e);
    expect(translateConstraintError(relabelled)?.message).toMatch(/cannot change/);
    const lot = await getLot(getDb(), lotId);
    await expect(editLot(operator, lotId, { ...lotInput(specB), identifier: lot!.identifier })).rejects.toThrow(/already has 1 specimen of Testmoor Cells TM-D-\d+; its cell specification cannot change/);
    expect((await getLot(getDb(), lotId))?.specification.id).toBe(specA);
  });

  it("registers no more specimens of a lot than cells were received", async () => {
    const operator = await makeUser("operator", "Otto Operator");
    const spec = await makeSpecification("TM-F");
    const lotId = await createLot(operator, lotInput(spec, 2));
    const first = await createSpecimen(operator, specimenInput(spec, lotId));
    await createSpecimen(operator, specimenInput(spec, lotId));
    await expect(createSpecimen(operator, specimenInput(spec, lotId))).rejects.toThrow(/received with 2 cells and all of them are registered/);
    // Editing one already in the lot is still allowed.
    const again = await getSpecimen(getDb(), first);
    await expect(
      editSpecimen(operator, first, specimenInputSchema.parse({ ...specimenInput(spec, lotId), identifier: again!.identifier, conditionOnReceipt: "dented" })),
    ).resolves.toBeUndefined();
    const lot = await getLot(getDb(), lotId);
    await expect(editLot(operator, lotId, { ...lotInput(spec, 1), identifier: lot!.identifier })).rejects.toThrow(/cannot be less/);
  });

  it("refuses a receipt dated in the future and a duplicate identifier", async () => {
    const operator = await makeUser("operator", "Otto Operator");
    const spec = await makeSpecification("TM-G");
    await expect(createLot(operator, { ...lotInput(spec), receivedOn: addDays(today, 1) })).rejects.toThrow(/is in the future/);
    const input = specimenInput(spec, null);
    await createSpecimen(operator, input);
    const error = await createSpecimen(operator, input).catch((e: unknown) => e);
    expect(translateConstraintError(error)?.message).toBe("A specimen with this identifier is already registered.");
  });
});
