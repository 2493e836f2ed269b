import "server-only";
import { sql } from "kysely";
import type { InspectionLevel, SamplingPlan } from "@/lib/lots/sampling";
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
  /** Who the lot's results are reported to (ISO/IEC 17025:2017 7.8.2.1 e); null for the lab's own work. */
  customer: string | null;
  quantityReceived: number;
  /** YYYY-MM-DD. */
  receivedOn: string;
  notes: string | null;
  /** Specimens registered from this lot so far. */
  specimenCount: number;
  /** The sampling plan as computed when it was set; null until an engineer sets one. */
  samplingPlan: SamplingPlan | null;
  /** Who set the plan and when; null without a plan. */
  planSetBy: { name: string; at: Date } | null;
  /** Whether the lot's sample has been drawn (the plan is then fixed). */
  sampleDrawn: boolean;
  updatedAt: Date;
}

export interface LotFields {
  identifier: string;
  cellSpecificationId: string;
  supplier: string;
  customer: string | null;
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
    .leftJoin("app_user as pu", "pu.id", "l.plan_set_by")
    .select((eb) => [
      "l.id",
      "l.identifier",
      "l.supplier",
      "l.customer",
      "l.quantity_received",
      sql<string>`l.received_on::text`.as("received_on"),
      "l.notes",
      "l.sampling_plan",
      "l.plan_set_at",
      "pu.display_name as plan_set_by_name",
      "l.updated_at",
      "s.id as spec_id",
      "s.maker",
      "s.model",
      "s.designation",
      eb.selectFrom("specimen").select(eb.fn.countAll<string>().as("n")).whereRef("specimen.lot_id", "=", "l.id").as("specimen_count"),
      eb.exists(eb.selectFrom("lot_sample_draw as d").select("d.id").whereRef("d.lot_id", "=", "l.id")).as("sample_drawn"),
    ]);
}

type Row = Awaited<ReturnType<ReturnType<typeof base>["executeTakeFirstOrThrow"]>>;

function toView(r: Row): LotView {
  return {
    id: r.id,
    identifier: r.identifier,
    specification: { id: r.spec_id, maker: r.maker, model: r.model, designation: r.designation },
    supplier: r.supplier,
    customer: r.customer,
    quantityReceived: r.quantity_received,
    receivedOn: r.received_on,
    notes: r.notes,
    specimenCount: Number(r.specimen_count ?? 0),
    samplingPlan: (r.sampling_plan as SamplingPlan | null) ?? null,
    planSetBy: r.plan_set_at && r.plan_set_by_name ? { name: r.plan_set_by_name, at: r.plan_set_at } : null,
    sampleDrawn: Boolean(r.sample_drawn),
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
    customer: l.customer,
    quantity_received: l.quantityReceived,
    received_on: l.receivedOn,
    notes: l.notes,
  };
}

/** The highest tray position registered in a lot, or 0: the lot's quantity cannot drop below it. */
export async function getHighestLotPosition(db: Executor, lotId: string): Promise<number> {
  const r = await db.selectFrom("specimen").select((eb) => eb.fn.max("lot_position").as("p")).where("lot_id", "=", lotId).executeTakeFirst();
  return Number(r?.p ?? 0);
}

export interface LotSamplingPlanColumns {
  inspectionLevel: InspectionLevel;
  aql: string;
  plan: SamplingPlan;
  acceptanceProcedureId: string | null;
  setBy: string;
}

export async function updateLotSamplingPlan(db: Executor, lotId: string, c: LotSamplingPlanColumns): Promise<void> {
  await db
    .updateTable("lot")
    .set({
      inspection_level: c.inspectionLevel,
      aql: c.aql,
      severity: "normal",
      sampling_plan: JSON.stringify(c.plan),
      acceptance_procedure_id: c.acceptanceProcedureId,
      plan_set_by: c.setBy,
      plan_set_at: new Date(),
      updated_at: new Date(),
    })
    .where("id", "=", lotId)
    .executeTakeFirstOrThrow();
}

/** The plan columns of a lot as stored, for services that check or recompute them. */
export async function getLotPlanColumns(
  db: Executor,
  lotId: string,
): Promise<{ inspectionLevel: InspectionLevel; aql: string; plan: SamplingPlan; acceptanceProcedureId: string | null } | null> {
  const r = await db
    .selectFrom("lot")
    .select(["inspection_level", "aql", "sampling_plan", "acceptance_procedure_id"])
    .where("id", "=", lotId)
    .executeTakeFirst();
  if (!r || r.inspection_level === null || r.aql === null || r.sampling_plan === null) return null;
  return { inspectionLevel: r.inspection_level, aql: r.aql, plan: r.sampling_plan as SamplingPlan, acceptanceProcedureId: r.acceptance_procedure_id };
}

export async function hasLotSampleDraw(db: Executor, lotId: string): Promise<boolean> {
  return (await db.selectFrom("lot_sample_draw").select("id").where("lot_id", "=", lotId).executeTakeFirst()) !== undefined;
}

export async function insertLotSampleDraw(
  db: Executor,
  d: { lotId: string; method: "random" | "chosen"; seed: string | null; positions: number[]; drawnBy: string },
): Promise<void> {
  await db.insertInto("lot_sample_draw").values({ lot_id: d.lotId, method: d.method, seed: d.seed, positions: d.positions, drawn_by: d.drawnBy }).execute();
}

/** Replaces the computed plan only (the lot size changed before the draw); level, AQL and who chose them stay. */
export async function updateLotComputedPlan(db: Executor, lotId: string, plan: SamplingPlan): Promise<void> {
  await db.updateTable("lot").set({ sampling_plan: JSON.stringify(plan) }).where("id", "=", lotId).executeTakeFirstOrThrow();
}
