import "server-only";
import { sql } from "kysely";
import type { AccuracySpecification } from "@/lib/instruments/accuracy";
import type { InstrumentKind } from "./schema";
import type { Executor } from "./index";

export interface InstrumentView {
  id: string;
  kind: InstrumentKind;
  identifier: string;
  serial: string;
  firmware: string | null;
  accuracy: AccuracySpecification;
  calibrationCertificate: string;
  /** YYYY-MM-DD. */
  calibratedOn: string;
  /** YYYY-MM-DD: the last day the calibration covers. */
  dueOn: string;
  active: boolean;
  updatedAt: Date;
}

export interface InstrumentFields {
  kind: InstrumentKind;
  identifier: string;
  serial: string;
  firmware: string | null;
  accuracy: AccuracySpecification;
  calibrationCertificate: string;
  calibratedOn: string;
  dueOn: string;
}

function base(db: Executor) {
  return db
    .selectFrom("instrument as i")
    .select([
      "i.id",
      "i.kind",
      "i.identifier",
      "i.serial",
      "i.firmware",
      "i.accuracy",
      "i.calibration_certificate",
      sql<string>`i.calibrated_on::text`.as("calibrated_on"),
      sql<string>`i.due_on::text`.as("due_on"),
      "i.active",
      "i.updated_at",
    ]);
}

type Row = Awaited<ReturnType<ReturnType<typeof base>["executeTakeFirstOrThrow"]>>;

function toView(r: Row): InstrumentView {
  return {
    id: r.id,
    kind: r.kind,
    identifier: r.identifier,
    serial: r.serial,
    firmware: r.firmware,
    // Stored only after validation against accuracySpecificationSchema (lib/instruments).
    accuracy: r.accuracy as AccuracySpecification,
    calibrationCertificate: r.calibration_certificate,
    calibratedOn: r.calibrated_on,
    dueOn: r.due_on,
    active: r.active,
    updatedAt: r.updated_at,
  };
}

/** Instruments in use first, each group by due date: what is overdue or falls due soonest leads. */
export async function listInstruments(db: Executor, filter: { kind?: InstrumentKind; inUseOnly?: boolean } = {}): Promise<InstrumentView[]> {
  let q = base(db).orderBy("i.active", "desc").orderBy("i.due_on").orderBy("i.identifier");
  if (filter.kind) q = q.where("i.kind", "=", filter.kind);
  if (filter.inUseOnly) q = q.where("i.active", "=", true);
  return (await q.execute()).map(toView);
}

export async function getInstrument(db: Executor, id: string, options: { forUpdate?: boolean } = {}): Promise<InstrumentView | null> {
  let q = base(db).where("i.id", "=", id);
  if (options.forUpdate) q = q.forUpdate();
  const r = await q.executeTakeFirst();
  return r ? toView(r) : null;
}

/** The named instruments, held FOR SHARE so none is changed or deactivated before the caller's transaction ends. */
export async function lockInstrumentsForUse(db: Executor, ids: readonly string[]): Promise<InstrumentView[]> {
  if (ids.length === 0) return [];
  return (await base(db).where("i.id", "in", ids).forShare().execute()).map(toView);
}

export async function insertInstrument(db: Executor, i: InstrumentFields & { createdBy: string }): Promise<string> {
  const r = await db
    .insertInto("instrument")
    .values({ ...toColumns(i), created_by: i.createdBy })
    .returning("id")
    .executeTakeFirstOrThrow();
  return r.id;
}

export async function updateInstrument(db: Executor, id: string, i: InstrumentFields): Promise<void> {
  await db
    .updateTable("instrument")
    .set({ ...toColumns(i), updated_at: new Date() })
    .where("id", "=", id)
    .executeTakeFirstOrThrow();
}

export async function setInstrumentActive(db: Executor, id: string, active: boolean): Promise<void> {
  await db.updateTable("instrument").set({ active, updated_at: new Date() }).where("id", "=", id).executeTakeFirstOrThrow();
}

function toColumns(i: InstrumentFields) {
  return {
    kind: i.kind,
    identifier: i.identifier,
    serial: i.serial,
    firmware: i.firmware,
    accuracy: JSON.stringify(i.accuracy),
    calibration_certificate: i.calibrationCertificate,
    calibrated_on: i.calibratedOn,
    due_on: i.dueOn,
  };
}
