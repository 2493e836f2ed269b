import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { translateConstraintError } from "@/db/constraint-errors";
import { getCellSpecification } from "@/db/cell-specifications";
import { attachDatasheet, createCellSpecification, editCellSpecification } from "@/lib/specs/cell-specifications";
import { cellSpecificationInputSchema } from "@/lib/specs/cell-specifications-input";
import { getObjectBytes, listObjectKeys, sha256Hex } from "@/lib/storage";
import { makeUser } from "./fixtures";
import { tinyPdf } from "../support/tiny-pdf";

const base = cellSpecificationInputSchema.parse({
  maker: "Testmoor Cells",
  model: "TM-21N50",
  data: {
    chemistry: { positiveElectrode: "N", label: "NMC" },
    shape: "cylindrical",
    ratedCapacityMah: 5000,
    nominalVoltageV: 3.6,
    chargeVoltageV: 4.2,
    standardChargeCurrentA: 1.5,
    maxContinuousDischargeCurrentA: 10,
    endOfDischargeVoltageV: 2.5,
    maxDiameterMm: 21.4,
    maxHeightMm: 70.3,
  },
});

let n = 0;
/** Each test registers its own model, since the tests of one file share a database. */
const fresh = () => ({ ...base, model: `TM-21N50-${++n}` });

const pdf = (body: string) => tinyPdf(body);

describe("cell specifications", () => {
  it("stores the computed IEC 61960 designation and records edits in the audit trail", async () => {
    const engineer = await makeUser("engineer", "Eve Engineer");
    const input = fresh();
    const id = await createCellSpecification(engineer, input);
    expect((await getCellSpecification(getDb(), id))?.designation).toBe("INR22/71");
    await editCellSpecification(engineer, id, { ...input, data: { ...input.data, maxDiameterMm: 18.4, maxHeightMm: 65.2 } });
    expect((await getCellSpecification(getDb(), id))?.designation).toBe("INR19/66");
    const events = await getDb().selectFrom("audit_event").select("action").where("entity_id", "=", id).execute();
    expect(events.map((e) => e.action)).toEqual(["spec.create", "spec.edit"]);
  });

  it("refuses a duplicate maker and model", async () => {
    const engineer = await makeUser("engineer", "Eve Engineer");
    const input = fresh();
    await createCellSpecification(engineer, input);
    const error = await createCellSpecification(engineer, input).catch((e: unknown) => e);
    expect(translateConstraintError(error)?.message).toBe("A specification for this maker and model already exists.");
  });

  it("stores a datasheet whole with its SHA-256, and refuses a file that is not a PDF", async () => {
    const engineer = await makeUser("engineer", "Eve Engineer");
    const id = await createCellSpecification(engineer, fresh());
    const bytes = await pdf("datasheet body");
    const stored = await attachDatasheet(engineer, id, { name: "tm-21n50.pdf", bytes });
    expect(stored.sha256).toBe(sha256Hex(bytes));
    const spec = await getCellSpecification(getDb(), id);
    expect(spec?.datasheet).toMatchObject({ name: "tm-21n50.pdf", sha256: stored.sha256, sizeBytes: bytes.byteLength });
    const file = await getDb().selectFrom("stored_file").select("storage_key").where("id", "=", stored.fileId).executeTakeFirstOrThrow();
    expect(sha256Hex(await getObjectBytes(file.storage_key))).toBe(stored.sha256);

    await expect(attachDatasheet(engineer, id, { name: "photo.png", bytes: new Uint8Array([0x89, 0x50, 0x4e, 0x47]) })).rejects.toThrow(/is not a PDF that can be opened/);
    await expect(attachDatasheet(engineer, id, { name: "big.pdf", bytes: new Uint8Array(11 * 1024 * 1024) })).rejects.toThrow(/is 11.0 MB; a datasheet may be at most 10 MB/);
    // Issue 11 row 12: an HTML page with "%PDF-" near its start was stored and served as a PDF.
    const html = new TextEncoder().encode("%PDF-1.4\n<html><body><script>alert(document.cookie)</script></body></html>\n%%EOF\n");
    await expect(attachDatasheet(engineer, id, { name: "page.pdf", bytes: html })).rejects.toThrow(/is not a PDF that can be opened/);
    const hidden = new TextEncoder().encode("<html><!-- %PDF-1.7 --><script>alert(1)</script></html>");
    await expect(attachDatasheet(engineer, id, { name: "page2.pdf", bytes: hidden })).rejects.toThrow(/is not a PDF that can be opened/);
    // The earlier datasheet is still the one on file.
    expect((await getCellSpecification(getDb(), id))?.datasheet?.sha256).toBe(stored.sha256);
  });

  it("removes the stored file again when the database write fails", async () => {
    const engineer = await makeUser("engineer", "Eve Engineer");
    const ghost = { ...engineer, id: "no-such-user" };
    const id = await createCellSpecification(engineer, fresh());
    const filesBefore = await getDb().selectFrom("stored_file").select("id").execute();
    // uploaded_by references app_user: an unknown uploader makes the insert fail after the file is stored.
    await expect(attachDatasheet(ghost, id, { name: "x.pdf", bytes: await pdf("orphan") })).rejects.toThrow();
    const files = await getDb().selectFrom("stored_file").select("id").execute();
    expect(files).toEqual(filesBefore);
    expect(await listObjectKeys(`datasheets/${id}/`)).toEqual([]);
    expect((await getCellSpecification(getDb(), id))?.datasheet).toBeNull();
  });
});
