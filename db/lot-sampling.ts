import "server-only";
import type { InspectionLevel, SamplingPlan } from "@/lib/lots/sampling";
import type { Executor } from "./index";

/** What one drawn cell has shown: the statement of conformity of its reviewed run, or "not tested". */
export type LotMemberResult = "conforms" | "does not conform" | "not decided" | "not tested";

export interface LotSampleMember {
  /** Tray position 1…lot size. */
  position: number;
  specimenId: string | null;
  specimenIdentifier: string | null;
  result: LotMemberResult;
  /** The reviewed run the result comes from. */
  runId: string | null;
  runNumber: string | null;
}

export interface LotSampleDrawView {
  method: "random" | "chosen";
  /** The seed of a random draw, as recorded (a whole number 0…2^32 − 1 as text); null for chosen positions. */
  seed: string | null;
  /** Tray positions in the order drawn. */
  positions: number[];
  drawnAt: Date;
  /** The display name of who drew it. */
  drawnBy: string;
}

/** A lot's sampling as recorded; lib/lots/sampling/read-lot-sampling.ts adds the lot decision. */
export interface LotSamplingRecord {
  plan: SamplingPlan | null;
  /** As the table heads its column: "0.65", "1.0". */
  aql: string | null;
  inspectionLevel: InspectionLevel | null;
  /** The procedure whose statement of conformity decides each drawn cell; null = any procedure's reviewed run. */
  acceptanceProcedure: { id: string; code: string } | null;
  draw: LotSampleDrawView | null;
  /** One per drawn position, in draw order. */
  members: LotSampleMember[];
  counts: { drawn: number; registered: number; tested: number; nonconforming: number; notDecided: number };
}

const REVIEWED: readonly ("accepted" | "certified")[] = ["accepted", "certified"];

/**
 * The latest reviewed result of each of these specimens: the statement of conformity of the
 * evaluation its accepting reviewer signed for (run accepted or certified), optionally only from
 * runs of one procedure. A later accepted review (a retest) replaces an earlier one.
 */
async function readReviewedResults(db: Executor, specimenIds: string[], procedureId: string | null) {
  if (specimenIds.length === 0) return new Map<string, { runId: string; runNumber: string; result: LotMemberResult }>();
  let q = db
    .selectFrom("run as r")
    .innerJoin("procedure_version as v", "v.id", "r.procedure_version_id")
    .innerJoin("run_review as rv", (j) => j.onRef("rv.run_id", "=", "r.id").on("rv.decision", "=", "accepted"))
    .innerJoin("run_evaluation as e", "e.id", "rv.run_evaluation_id")
    .select(["r.specimen_id", "r.id", "r.number", "e.specimen_conforms", "rv.created_at"])
    .where("r.specimen_id", "in", specimenIds)
    .where("r.status", "in", REVIEWED);
  if (procedureId) q = q.where("v.procedure_id", "=", procedureId);
  const rows = await q.orderBy("rv.created_at", "desc").orderBy("r.number", "desc").execute();
  const latest = new Map<string, { runId: string; runNumber: string; result: LotMemberResult }>();
  for (const row of rows) {
    if (latest.has(row.specimen_id)) continue;
    latest.set(row.specimen_id, { runId: row.id, runNumber: row.number, result: toResult(row.specimen_conforms) });
  }
  return latest;
}

function toResult(statement: string): LotMemberResult {
  return statement === "conforms" || statement === "does not conform" ? statement : "not decided";
}

/** A lot's sampling as recorded: its plan, the drawn sample with each cell's reviewed result, and the counts. */
export async function getLotSamplingRecord(db: Executor, lotId: string): Promise<LotSamplingRecord | null> {
  const lot = await db
    .selectFrom("lot as l")
    .leftJoin("procedure as p", "p.id", "l.acceptance_procedure_id")
    .select(["l.id", "l.sampling_plan", "l.aql", "l.inspection_level", "p.id as procedure_id", "p.code as procedure_code"])
    .where("l.id", "=", lotId)
    .executeTakeFirst();
  if (!lot) return null;
  const plan = (lot.sampling_plan as SamplingPlan | null) ?? null;
  const drawRow = await db
    .selectFrom("lot_sample_draw as d")
    .innerJoin("app_user as u", "u.id", "d.drawn_by")
    .select(["d.method", "d.seed", "d.positions", "d.drawn_at", "u.display_name"])
    .where("d.lot_id", "=", lotId)
    .executeTakeFirst();
  const draw: LotSampleDrawView | null = drawRow
    ? { method: drawRow.method, seed: drawRow.seed, positions: drawRow.positions.map(Number), drawnAt: drawRow.drawn_at, drawnBy: drawRow.display_name }
    : null;

  const positions = draw?.positions ?? [];
  const specimens =
    positions.length === 0
      ? []
      : await db.selectFrom("specimen").select(["id", "identifier", "lot_position"]).where("lot_id", "=", lotId).where("lot_position", "in", positions).execute();
  const byPosition = new Map(specimens.map((s) => [s.lot_position as number, s]));
  const results = await readReviewedResults(
    db,
    specimens.map((s) => s.id),
    lot.procedure_id,
  );
  const members = positions.map((position): LotSampleMember => {
    const specimen = byPosition.get(position);
    const reviewed = specimen ? results.get(specimen.id) : undefined;
    return {
      position,
      specimenId: specimen?.id ?? null,
      specimenIdentifier: specimen?.identifier ?? null,
      result: reviewed?.result ?? "not tested",
      runId: reviewed?.runId ?? null,
      runNumber: reviewed?.runNumber ?? null,
    };
  });

  const count = (result: LotMemberResult) => members.filter((m) => m.result === result).length;
  const nonconforming = count("does not conform");
  const tested = count("conforms") + nonconforming;
  const counts = { drawn: members.length, registered: specimens.length, tested, nonconforming, notDecided: count("not decided") };
  return {
    plan,
    aql: lot.aql,
    inspectionLevel: lot.inspection_level,
    acceptanceProcedure: lot.procedure_id && lot.procedure_code ? { id: lot.procedure_id, code: lot.procedure_code } : null,
    draw,
    members,
    counts,
  };
}

/** A procedure that has a released version, by id: the acceptance procedure of a lot must be one. */
export async function findReleasedProcedure(db: Executor, procedureId: string): Promise<{ id: string; code: string } | null> {
  const r = await db
    .selectFrom("procedure as p")
    .select(["p.id", "p.code"])
    .where("p.id", "=", procedureId)
    .where((eb) => eb.exists(eb.selectFrom("procedure_version as v").select("v.id").whereRef("v.procedure_id", "=", "p.id").where("v.status", "=", "released")))
    .executeTakeFirst();
  return r ?? null;
}

/** The procedure's code, whatever the state of its versions (for the audit trail's before/after). */
export async function getProcedureCode(db: Executor, procedureId: string | null): Promise<string | null> {
  if (!procedureId) return null;
  const r = await db.selectFrom("procedure").select("code").where("id", "=", procedureId).executeTakeFirst();
  return r?.code ?? null;
}
