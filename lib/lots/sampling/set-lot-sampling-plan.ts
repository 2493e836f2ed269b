import "server-only";
import { getDb, type Executor } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { findReleasedProcedure, getProcedureCode } from "@/db/lot-sampling";
import { getLotPlanColumns, hasLotSampleDraw, lockLot, updateLotSamplingPlan } from "@/db/lots";
import { can } from "@/lib/auth/permissions";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import type { SamplingPlan } from "@/lib/lots/sampling";
import { computeSamplingPlan, fieldRefusal } from "./compute-sampling-plan";
import { lotSamplingPlanInputSchema, type LotSamplingPlanInput } from "./sampling-plan-input";

const label = (u: SignedInUser) => `${u.displayName} <${u.email}>`;

/** Setting a lot's plan and drawing its sample are the quality engineer's work. */
export function refuseUnlessEngineer(actor: SignedInUser, what: string): void {
  if (!can(actor.role, "lot.sample")) throw new DomainError("forbidden", `Only a quality engineer ${what}.`);
}

/** The plan in the audit trail: the choice and what the tables made of it. */
export function describePlanForAudit(plan: SamplingPlan, acceptanceProcedure: string | null) {
  return {
    inspectionLevel: plan.inspectionLevel,
    aql: plan.aqlLabel,
    severity: plan.severity,
    codeLetter: plan.codeLetter,
    sampleSize: plan.sampleSize,
    acceptanceNumber: plan.acceptanceNumber,
    rejectionNumber: plan.rejectionNumber,
    hundredPercent: plan.hundredPercent,
    acceptanceProcedure: acceptanceProcedure ?? "any procedure's reviewed run",
  };
}

async function readAcceptanceProcedure(tx: Executor, id: string | null): Promise<{ id: string; code: string } | null> {
  if (!id) return null;
  const procedure = await findReleasedProcedure(tx, id);
  if (!procedure) throw fieldRefusal("acceptanceProcedureId", "That procedure has no released version; choose a released procedure, or any procedure.");
  return procedure;
}

/**
 * Sets (or changes) a lot's ISO 2859-1 plan from its quantity, the inspection level and the AQL, at
 * normal inspection. Refused once the sample is drawn: the drawn sample belongs to the plan it was
 * drawn under. One transaction with its audit event; nothing is stored when the plan is refused.
 */
export async function setLotSamplingPlan(actor: SignedInUser, lotId: string, input: LotSamplingPlanInput): Promise<SamplingPlan> {
  refuseUnlessEngineer(actor, "sets a lot's sampling plan");
  const choice = lotSamplingPlanInputSchema.parse(input);
  return getDb()
    .transaction()
    .execute(async (tx) => {
      const lot = await lockLot(tx, lotId);
      if (!lot) throw new DomainError("not-found", "No such lot.");
      if (await hasLotSampleDraw(tx, lotId)) {
        throw new DomainError("conflict", `The sample of lot ${lot.identifier} is already drawn; its sampling plan stays the one it was drawn under.`);
      }
      const plan = computeSamplingPlan({ lotSize: lot.quantityReceived, inspectionLevel: choice.inspectionLevel, aql: choice.aql });
      const procedure = await readAcceptanceProcedure(tx, choice.acceptanceProcedureId);
      const before = await getLotPlanColumns(tx, lotId);
      await updateLotSamplingPlan(tx, lotId, {
        inspectionLevel: plan.inspectionLevel,
        aql: plan.aqlLabel,
        plan,
        acceptanceProcedureId: procedure?.id ?? null,
        setBy: actor.id,
      });
      await recordAuditEvent(tx, {
        actorId: actor.id,
        actorLabel: label(actor),
        action: "lot.set-sampling-plan",
        entityType: "lot",
        entityId: lotId,
        before: before ? describePlanForAudit(before.plan, await getProcedureCode(tx, before.acceptanceProcedureId)) : undefined,
        after: describePlanForAudit(plan, procedure?.code ?? null),
        detail: { lotSize: lot.quantityReceived, source: plan.source },
      });
      return plan;
    });
}
