import "server-only";
import { z } from "zod";
import type { Executor } from "@/db";
import { lockInstrumentsForUse } from "@/db/instruments";
import { DomainError } from "@/lib/errors";
import { computeCalibrationStatus, countDaysUntilDue } from "./calibration-status";
import { INSTRUMENT_KIND_LABELS } from "./instrument-kind";

const uuid = z.uuid();

/**
 * Refuses a run on an instrument that is deactivated, overdue for calibration or not in the register,
 * naming each one. Call it inside the transaction that starts the run: the instruments stay locked
 * (FOR SHARE) until it ends, so none is deactivated or re-dated in between.
 */
export async function assertInstrumentsUsable(db: Executor, ids: readonly string[], today: string): Promise<void> {
  const wanted = [...new Set(ids)];
  const known = wanted.filter((id) => uuid.safeParse(id).success);
  const found = await lockInstrumentsForUse(db, known);
  const problems: string[] = [];
  for (const id of wanted) {
    const i = found.find((x) => x.id === id);
    if (!i) {
      problems.push(`instrument ${id} is not in the register`);
      continue;
    }
    const name = `${INSTRUMENT_KIND_LABELS[i.kind]} ${i.identifier}`;
    if (!i.active) problems.push(`${name} is deactivated`);
    if (computeCalibrationStatus(i.dueOn, today) === "overdue") {
      const days = -countDaysUntilDue(i.dueOn, today);
      problems.push(`${name} is overdue for calibration (due on ${i.dueOn}, ${days} ${days === 1 ? "day" : "days"} ago)`);
    }
  }
  if (problems.length > 0) throw new DomainError("conflict", `The run cannot start: ${problems.join("; ")}.`);
}
