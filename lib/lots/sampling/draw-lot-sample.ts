import "server-only";
import { randomInt } from "node:crypto";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getLotPlanColumns, hasLotSampleDraw, insertLotSampleDraw, lockLot } from "@/db/lots";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { drawSample, type SamplingPlan } from "@/lib/lots/sampling";
import { fieldRefusal } from "./compute-sampling-plan";
import { lotSampleDrawInputSchema, type LotSampleDrawInput } from "./sampling-plan-input";
import { refuseUnlessEngineer } from "./set-lot-sampling-plan";

const label = (u: SignedInUser) => `${u.displayName} <${u.email}>`;

/**
 * Tray positions 1…lot size as zero-padded text ("007" in a lot of 240), so that drawSample's
 * code-unit ordering is the positions' numeric order and a recorded seed repeats the same draw.
 */
export function drawLotPositions(lotSize: number, n: number, seed: number): number[] {
  const width = String(lotSize).length;
  const ids = Array.from({ length: lotSize }, (_, k) => String(k + 1).padStart(width, "0"));
  const result = drawSample({ specimenIds: ids, n, seed });
  if (!result.ok) throw fieldRefusal(result.error.field === "seed" ? "seed" : "positions", result.error.message);
  return result.draw.drawn.map(Number);
}

function checkChosenPositions(positions: readonly number[], plan: SamplingPlan, lotSize: number): void {
  const n = plan.sampleSize;
  if (positions.length > lotSize) {
    throw fieldRefusal("positions", `Cannot draw ${positions.length} cells from a lot of ${lotSize}.`);
  }
  const outside = positions.filter((p) => !Number.isInteger(p) || p < 1 || p > lotSize);
  if (outside.length > 0) {
    throw fieldRefusal("positions", `Tray position${outside.length === 1 ? "" : "s"} ${outside.join(", ")} ${outside.length === 1 ? "is" : "are"} outside the lot: its cells are numbered 1 to ${lotSize}.`);
  }
  const repeated = [...new Set(positions.filter((p, k) => positions.indexOf(p) !== k))];
  if (repeated.length > 0) {
    throw fieldRefusal("positions", `Tray position${repeated.length === 1 ? "" : "s"} ${repeated.join(", ")} ${repeated.length === 1 ? "is" : "are"} listed twice; each cell is drawn once.`);
  }
  if (positions.length !== n) {
    throw fieldRefusal("positions", `The plan calls for ${n} cells; ${positions.length} tray position${positions.length === 1 ? " was" : "s were"} given.`);
  }
}

/**
 * Draws a lot's sample once, under its plan: plan.sampleSize tray positions, at random from a seed
 * (the server's own from crypto.randomInt unless the engineer gives one; recorded so anyone can
 * repeat the draw) or as chosen positions. One transaction with its audit event; a refused draw
 * stores nothing.
 */
export async function drawLotSample(
  actor: SignedInUser,
  lotId: string,
  input: { method: "random"; seed?: number } | { method: "chosen"; positions: number[] },
): Promise<{ positions: number[]; seed: string | null }> {
  refuseUnlessEngineer(actor, "draws a lot's sample");
  const how: LotSampleDrawInput = lotSampleDrawInputSchema.parse(input);
  return getDb()
    .transaction()
    .execute(async (tx) => {
      const lot = await lockLot(tx, lotId);
      if (!lot) throw new DomainError("not-found", "No such lot.");
      if (await hasLotSampleDraw(tx, lotId)) throw new DomainError("conflict", `The sample of lot ${lot.identifier} is already drawn; a drawn sample is never drawn again.`);
      const stored = await getLotPlanColumns(tx, lotId);
      if (!stored) throw new DomainError("conflict", `Lot ${lot.identifier} has no sampling plan yet: set the inspection level and AQL first.`);
      const { plan } = stored;
      if (plan.lotSize !== lot.quantityReceived) {
        throw new DomainError("conflict", `The plan was set for a lot of ${plan.lotSize} cells but the lot now holds ${lot.quantityReceived}: set the plan again first.`);
      }
      if (plan.sampleSize > lot.quantityReceived) {
        throw new DomainError("invalid", `Cannot draw ${plan.sampleSize} cells from a lot of ${lot.quantityReceived}: inspect the whole lot.`);
      }
      let positions: number[];
      let seed: string | null;
      if (how.method === "random") {
        const value = how.seed ?? randomInt(2 ** 32);
        positions = drawLotPositions(lot.quantityReceived, plan.sampleSize, value);
        seed = String(value);
      } else {
        checkChosenPositions(how.positions, plan, lot.quantityReceived);
        positions = [...how.positions];
        seed = null;
      }
      await insertLotSampleDraw(tx, { lotId, method: how.method, seed, positions, drawnBy: actor.id });
      await recordAuditEvent(tx, {
        actorId: actor.id,
        actorLabel: label(actor),
        action: "lot.draw-sample",
        entityType: "lot",
        entityId: lotId,
        after: { method: how.method === "random" ? "at random" : "chosen positions", seed, positions: positions.join(", ") },
        detail: { codeLetter: plan.codeLetter, sampleSize: plan.sampleSize, lotSize: lot.quantityReceived },
      });
      return { positions, seed };
    });
}
