import "server-only";
import { sql } from "kysely";
import { toLikePattern, type SpecificationRef } from "./lots";
import type { Executor } from "./index";

export interface SpecimenView {
  id: string;
  identifier: string;
  specification: SpecificationRef;
  lot: { id: string; identifier: string } | null;
  /** The cell's tray position in its lot (1…lot size), when recorded. */
  lotPosition: number | null;
  /** YYYY-MM-DD. */
  receivedOn: string;
  conditionOnReceipt: string;
  notes: string | null;
  updatedAt: Date;
}

export interface SpecimenFields {
  identifier: string;
  cellSpecificationId: string;
  lotId: string | null;
  lotPosition: number | null;
  receivedOn: string;
  conditionOnReceipt: string;
  notes: string | null;
}

function base(db: Executor) {
  return db
    .selectFrom("specimen as c")
    .innerJoin("cell_specification as s", "s.id", "c.cell_specification_id")
    .leftJoin("lot as l", "l.id", "c.lot_id")
    .select([
      "c.id",
      "c.identifier",
      "c.lot_position",
      sql<string>`c.received_on::text`.as("received_on"),
      "c.condition_on_receipt",
      "c.notes",
      "c.updated_at",
      "s.id as spec_id",
      "s.maker",
      "s.model",
      "s.designation",
      "l.id as lot_id",
      "l.identifier as lot_identifier",
    ]);
}

type Row = Awaited<ReturnType<ReturnType<typeof base>["executeTakeFirstOrThrow"]>>;

function toView(r: Row): SpecimenView {
  return {
    id: r.id,
    identifier: r.identifier,
    specification: { id: r.spec_id, maker: r.maker, model: r.model, designation: r.designation },
    lot: r.lot_id && r.lot_identifier ? { id: r.lot_id, identifier: r.lot_identifier } : null,
    lotPosition: r.lot_position,
    receivedOn: r.received_on,
    conditionOnReceipt: r.condition_on_receipt,
    notes: r.notes,
    updatedAt: r.updated_at,
  };
}

/** By identifier. `q` matches the specimen or lot identifier, the cell's maker, model or designation, or the condition. */
export async function listSpecimens(db: Executor, filter: { q?: string; lotId?: string } = {}): Promise<SpecimenView[]> {
  let q = base(db).orderBy("c.identifier");
  if (filter.q) {
    const like = toLikePattern(filter.q);
    q = q.where((eb) =>
      eb.or([
        eb("c.identifier", "ilike", like),
        eb("l.identifier", "ilike", like),
        eb("s.maker", "ilike", like),
        eb("s.model", "ilike", like),
        eb("s.designation", "ilike", like),
        eb("c.condition_on_receipt", "ilike", like),
      ]),
    );
  }
  if (filter.lotId) q = q.where("c.lot_id", "=", filter.lotId);
  return (await q.execute()).map(toView);
}

export async function getSpecimen(db: Executor, id: string, options: { forUpdate?: boolean } = {}): Promise<SpecimenView | null> {
  let q = base(db).where("c.id", "=", id);
  // Only the specimen's own row: the joined lot is locked separately when it matters.
  if (options.forUpdate) q = q.forUpdate("c");
  const r = await q.executeTakeFirst();
  return r ? toView(r) : null;
}

export async function insertSpecimen(db: Executor, c: SpecimenFields & { createdBy: string }): Promise<string> {
  const r = await db
    .insertInto("specimen")
    .values({ ...toColumns(c), created_by: c.createdBy })
    .returning("id")
    .executeTakeFirstOrThrow();
  return r.id;
}

export async function updateSpecimen(db: Executor, id: string, c: SpecimenFields): Promise<void> {
  await db
    .updateTable("specimen")
    .set({ ...toColumns(c), updated_at: new Date() })
    .where("id", "=", id)
    .executeTakeFirstOrThrow();
}

function toColumns(c: SpecimenFields) {
  return {
    identifier: c.identifier,
    cell_specification_id: c.cellSpecificationId,
    lot_id: c.lotId,
    lot_position: c.lotId ? c.lotPosition : null,
    received_on: c.receivedOn,
    condition_on_receipt: c.conditionOnReceipt,
    notes: c.notes,
  };
}

/** Whether any run, in whatever state, was planned on this specimen. */
export async function specimenHasRuns(db: Executor, specimenId: string): Promise<boolean> {
  return (await db.selectFrom("run").select("id").where("specimen_id", "=", specimenId).limit(1).executeTakeFirst()) !== undefined;
}

/** The specimen registered at a tray position of a lot, if any. */
export async function findSpecimenAtLotPosition(db: Executor, lotId: string, position: number): Promise<{ id: string; identifier: string } | null> {
  const r = await db.selectFrom("specimen").select(["id", "identifier"]).where("lot_id", "=", lotId).where("lot_position", "=", position).executeTakeFirst();
  return r ?? null;
}
