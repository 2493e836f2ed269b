import "server-only";
import { sql } from "kysely";
import type { Executor } from "./index";

/** The cell specification a lot or specimen is of, as lists and links show it. */
export interface SpecificationRef {
  id: string;
  maker: string;
  model: string;
  designation: string;
}

export interface LotView {
  id: string;
  identifier: string;
  specification: SpecificationRef;
  supplier: string;
  quantityReceived: number;
  /** YYYY-MM-DD. */
  receivedOn: string;
  notes: string | null;
  /** Specimens registered from this lot so far. */
  specimenCount: number;
  updatedAt: Date;
}

export interface LotFields {
  identifier: string;
  cellSpecificationId: string;
  supplier: string;
  quantityReceived: number;
  receivedOn: string;
  notes: string | null;
}

/** `%text%` for ILIKE with the pattern characters escaped. */
export function toLikePattern(text: string): string {
  return `%${text.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
}

function base(db: Executor) {
  return db
    .selectFrom("lot as l")
    .innerJoin("cell_specification as s", "s.id", "l.cell_specification_id")
    .select((eb) => [
      "l.id",
      "l.identifier",
      "l.supplier",
      "l.quantity_received",
      sql<string>`l.received_on::text`.as("received_on"),
      "l.notes",
      "l.updated_at",
      "s.id as spec_id",
      "s.maker",
      "s.model",
      "s.designation",
      eb.selectFrom("specimen").select(eb.fn.countAll<string>().as("n")).whereRef("specimen.lot_id", "=", "l.id").as("specimen_count"),
    ]);
}

type Row = Awaited<ReturnType<ReturnType<typeof base>["executeTakeFirstOrThrow"]>>;

function toView(r: Row): LotView {
  return {
    id: r.id,
    identifier: r.identifier,
    specification: { id: r.spec_id, maker: r.maker, model: r.model, designation: r.designation },
    supplier: r.supplier,
    quantityReceived: r.quantity_received,
    receivedOn: r.received_on,
    notes: r.notes,
    specimenCount: Number(r.specimen_count ?? 0),
    updatedAt: r.updated_at,
  };
}

/** Newest receipt first. `q` matches the lot identifier, the supplier, or the cell's maker, model or designation. */
export async function listLots(db: Executor, filter: { q?: string; specificationId?: string } = {}): Promise<LotView[]> {
  let q = base(db).orderBy("l.received_on", "desc").orderBy("l.identifier");
  if (filter.q) {
    const like = toLikePattern(filter.q);
    q = q.where((eb) =>
      eb.or([eb("l.identifier", "ilike", like), eb("l.supplier", "ilike", like), eb("s.maker", "ilike", like), eb("s.model", "ilike", like), eb("s.designation", "ilike", like)]),
    );
  }
  if (filter.specificationId) q = q.where("l.cell_specification_id", "=", filter.specificationId);
  return (await q.execute()).map(toView);
}

export async function getLot(db: Executor, id: string): Promise<LotView | null> {
  const r = await base(db).where("l.id", "=", id).executeTakeFirst();
  return r ? toView(r) : null;
}

/**
 * Locks a lot's row for the rest of the transaction and returns what checks on it need. Adding a
 * specimen takes this lock, so two people adding the last cells of a lot cannot both pass the count.
 */
export async function lockLot(db: Executor, id: string): Promise<{ identifier: string; cellSpecificationId: string; quantityReceived: number } | null> {
  const r = await db
    .selectFrom("lot")
    .select(["identifier", "cell_specification_id", "quantity_received"])
    .where("id", "=", id)
    .forUpdate()
    .executeTakeFirst();
  return r ? { identifier: r.identifier, cellSpecificationId: r.cell_specification_id, quantityReceived: r.quantity_received } : null;
}

export async function countSpecimensOfLot(db: Executor, lotId: string, options: { otherThan?: string } = {}): Promise<number> {
  let q = db.selectFrom("specimen").select((eb) => eb.fn.countAll<string>().as("n")).where("lot_id", "=", lotId);
  if (options.otherThan) q = q.where("id", "<>", options.otherThan);
  return Number((await q.executeTakeFirstOrThrow()).n);
}

export async function insertLot(db: Executor, l: LotFields & { createdBy: string }): Promise<string> {
  const r = await db
    .insertInto("lot")
    .values({ ...toColumns(l), created_by: l.createdBy })
    .returning("id")
    .executeTakeFirstOrThrow();
  return r.id;
}

export async function updateLot(db: Executor, id: string, l: LotFields): Promise<void> {
  await db
    .updateTable("lot")
    .set({ ...toColumns(l), updated_at: new Date() })
    .where("id", "=", id)
    .executeTakeFirstOrThrow();
}

function toColumns(l: LotFields) {
  return {
    identifier: l.identifier,
    cell_specification_id: l.cellSpecificationId,
    supplier: l.supplier,
    quantity_received: l.quantityReceived,
    received_on: l.receivedOn,
    notes: l.notes,
  };
}
