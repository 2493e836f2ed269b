import "server-only";
import { z } from "zod";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { clearFailures, listFailureGroups } from "@/db/sign-in-attempts";
import { SIGN_IN_LIMITS } from "./sign-in";
import type { SignedInUser } from "./signed-in-user";

/** What an administrator sees: refused (account, address) pairs, refused addresses, slowed accounts. */
export async function listSignInLimits(now = new Date()) {
  const since = new Date(now.getTime() - SIGN_IN_LIMITS.windowMinutes * 60_000);
  return listFailureGroups(getDb(), {
    since,
    pair: SIGN_IN_LIMITS.perAccountAndAddress,
    address: SIGN_IN_LIMITS.perAddress,
    account: SIGN_IN_LIMITS.slowDownAfter,
  });
}

export const clearLimitSchema = z
  .object({
    email: z.string().trim().toLowerCase().max(320).optional().transform((v) => v || undefined),
    address: z.string().trim().max(100).optional().transform((v) => v || undefined),
  })
  .refine((v) => v.email || v.address, "Say which account or address to clear.");

/** Forgets the failures behind a limit, so the person can sign in at once; audited. */
export async function clearSignInLimit(actor: SignedInUser, input: z.input<typeof clearLimitSchema>, address?: string): Promise<number> {
  const q = clearLimitSchema.parse(input);
  return getDb().transaction().execute(async (tx) => {
    const forgotten = await clearFailures(tx, q);
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: `${actor.displayName} <${actor.email}>`,
      action: "auth.limit-cleared",
      entityType: "sign-in",
      detail: { email: q.email ?? "(any account)", address: q.address ?? "(any address)", failuresForgotten: forgotten },
      address,
    });
    return forgotten;
  });
}

/** Refused cross-site requests and requests with an unknown cycler token of the last day, counted per 10-minute window and origin (or address). */
export async function listRefusedRequests(now = new Date()) {
  return getDb()
    .selectFrom("refused_request_tally")
    .select(["window_start", "kind", "origin", "last_path", "count", "last_at"])
    .where("window_start", ">", new Date(now.getTime() - 24 * 3_600_000))
    .orderBy("last_at", "desc")
    .limit(100)
    .execute();
}
