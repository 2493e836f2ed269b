import "server-only";
import { z } from "zod";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getInstrument } from "@/db/instruments";
import { getMachineToken, insertMachineToken, listMachineTokens, markMachineTokenRevoked } from "@/db/machine-tokens";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { TOKEN_DEFAULT_DAYS, TOKEN_MAX_DAYS, tokenExpiry } from "./token-policy";
import { makeTokenSecret } from "./token-secret";

export const issueTokenSchema = z.object({
  instrumentId: z.uuid("Choose the cycler channel the token is for."),
  label: z.string().trim().min(1, "Give the token a label (which PC or cycler it goes on).").max(100, "Use at most 100 characters for the label."),
  days: z.coerce
    .number("Enter the number of days the token lives.")
    .int("Enter whole days.")
    .min(1, "A token lives at least 1 day.")
    .max(TOKEN_MAX_DAYS, `A token lives at most ${TOKEN_MAX_DAYS} days; issue a new one when it runs out.`)
    .default(TOKEN_DEFAULT_DAYS),
});

export const revokeTokenSchema = z.object({
  tokenId: z.uuid("No such token."),
  reason: z.string().trim().min(3, "Say why the token is revoked (e.g. \"PC replaced\").").max(500, "Use at most 500 characters for the reason."),
});

const actorLabel = (u: SignedInUser) => `${u.displayName} <${u.email}>`;

/** Every token issued, newest first, each with whether it may still be used now. */
export async function listTokens(now = new Date()) {
  const tokens = await listMachineTokens(getDb());
  return tokens.map((t) => ({ ...t, state: t.revokedAt ? ("revoked" as const) : t.expiresAt.getTime() <= now.getTime() ? ("expired" as const) : ("in-use" as const) }));
}

/**
 * Issues a token for one cycler channel. The token itself is returned once, here, and never stored:
 * only its SHA-256 is (token-secret.ts says why that is enough).
 */
export async function issueMachineToken(actor: SignedInUser, input: z.input<typeof issueTokenSchema>, now = new Date()) {
  const q = issueTokenSchema.parse(input);
  const secret = makeTokenSecret();
  const expiresAt = tokenExpiry(now, q.days);
  return getDb().transaction().execute(async (tx) => {
    const channel = await getInstrument(tx, q.instrumentId);
    if (!channel || channel.kind !== "cycler-channel") throw new DomainError("invalid", "Choose a cycler channel: tokens push logs for cycler channels only.", { field: "instrumentId" });
    if (!channel.active) throw new DomainError("conflict", `${channel.identifier} is retired; issue tokens for channels in use.`, { field: "instrumentId" });
    const id = await insertMachineToken(tx, { instrumentId: channel.id, label: q.label, sha256: secret.sha256, hint: secret.hint, issuedBy: actor.id, issuedAt: now, expiresAt });
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: actorLabel(actor),
      action: "machine-token.issue",
      entityType: "instrument",
      entityId: channel.id,
      after: { tokenId: id, label: q.label, hint: secret.hint, expiresAt: expiresAt.toISOString() },
    });
    return { id, token: secret.token, label: q.label, channel: channel.identifier, expiresAt };
  });
}

/** Revokes a token with a reason, at once and for good; a token already revoked is refused in plain words. */
export async function revokeMachineToken(actor: SignedInUser, input: z.input<typeof revokeTokenSchema>, now = new Date()) {
  const q = revokeTokenSchema.parse(input);
  return getDb().transaction().execute(async (tx) => {
    const token = await getMachineToken(tx, q.tokenId, { forUpdate: true });
    if (!token) throw new DomainError("not-found", "No such token.");
    if (token.revokedAt) throw new DomainError("conflict", `The token "${token.label}" is already revoked.`);
    await markMachineTokenRevoked(tx, token.id, actor.id, q.reason, now);
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: actorLabel(actor),
      action: "machine-token.revoke",
      entityType: "instrument",
      entityId: token.instrumentId,
      detail: { tokenId: token.id, label: token.label, reason: q.reason },
    });
    return { label: token.label, channel: token.instrumentIdentifier };
  });
}
