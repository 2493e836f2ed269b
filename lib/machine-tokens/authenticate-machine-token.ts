import "server-only";
import { sql } from "kysely";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { countMachineTokenRequest, findMachineTokenBySha256, type MachineTokenRecord } from "@/db/machine-tokens";
import { truncateHeaderText } from "@/lib/auth/foreign-origin";
import { DomainError } from "@/lib/errors";
import { rateWindowStart, refuseTokenUse, TOKEN_REQUESTS_PER_MINUTE } from "./token-policy";
import { hashTokenSecret, looksLikeToken, readBearerToken } from "./token-secret";

/** A cycler PC, known by the token it sent: what a token route's handler receives instead of a user. */
export interface MachineCaller {
  kind: "machine";
  tokenId: string;
  label: string;
  instrumentId: string;
  channel: string;
  /** The client address, for the audit trail. */
  address: string;
}

/** How a token appears in the audit trail as the one who acted. */
export function machineActorLabel(c: { label: string; channel: string }): string {
  return `cycler token "${c.label}" (${c.channel})`;
}

export function requestAddress(req: Request): string {
  const forwarded = req.headers.get("x-forwarded-for")?.split(",")[0]?.trim();
  return truncateHeaderText(forwarded || req.headers.get("x-real-ip") || "unknown", 100);
}

/**
 * The caller of a token route: the token of the `Authorization: Bearer` header, known, not revoked, not
 * expired and within its rate. Cookies are never read here, so a browser session alone gets nowhere.
 * Every refusal is audited: one for a known token (its requests are rate-limited, so a client stuck in a
 * loop adds at most one row per request up to the limit, then one for the limit), and for an unknown
 * token the first from each address in a 10-minute window (the rest are counted, see recordUnknownToken).
 */
export async function authenticateMachineToken(req: Request, now = new Date()): Promise<MachineCaller> {
  const address = requestAddress(req);
  const presented = readBearerToken(req.headers.get("authorization"));
  const token = presented && looksLikeToken(presented) ? await findMachineTokenBySha256(getDb(), hashTokenSecret(presented)) : null;
  if (!token) {
    await recordUnknownToken({ address, path: new URL(req.url).pathname, sent: presented !== null }, now);
    throw new DomainError(
      "unauthenticated",
      presented ? "This token is not known here. Check the token file, or ask the lab's administrator for a new token." : "Send the channel's token in an Authorization header (Bearer).",
    );
  }
  const caller: MachineCaller = { kind: "machine", tokenId: token.id, label: token.label, instrumentId: token.instrumentId, channel: token.instrumentIdentifier, address };
  const count = await countMachineTokenRequest(getDb(), token.id, rateWindowStart(now), now);
  if (count > TOKEN_REQUESTS_PER_MINUTE) {
    if (count === TOKEN_REQUESTS_PER_MINUTE + 1) {
      await auditTokenRefusal(caller, token, "rate-limited", `More than ${TOKEN_REQUESTS_PER_MINUTE} requests in one minute; further ones this minute are refused without a record.`);
    }
    throw new DomainError("rate-limited", `Too many requests with this token: at most ${TOKEN_REQUESTS_PER_MINUTE} a minute. Wait a minute and send again.`);
  }
  const refusal = refuseTokenUse(token, now);
  if (refusal) {
    await auditTokenRefusal(caller, token, refusal.code, refusal.message);
    throw new DomainError("unauthenticated", refusal.message);
  }
  return caller;
}

async function auditTokenRefusal(caller: MachineCaller, token: MachineTokenRecord, reason: string, message: string): Promise<void> {
  await recordAuditEvent(getDb(), {
    actorId: null,
    actorLabel: machineActorLabel(caller),
    action: "machine-token.refused",
    entityType: "instrument",
    entityId: token.instrumentId,
    detail: { tokenId: token.id, reason, message },
    address: caller.address,
  });
}

const UNKNOWN_WINDOW_MS = 10 * 60_000;

/**
 * Requests with no token or an unknown one are counted in refused_request_tally (kind "unknown-token",
 * keyed by address) and only the first from an address in a 10-minute window is audited, so someone
 * guessing tokens grows a count, not the audit trail. Best effort: a failure here never changes the refusal.
 */
async function recordUnknownToken(e: { address: string; path: string; sent: boolean }, now: Date): Promise<void> {
  try {
    const windowStart = new Date(Math.floor(now.getTime() / UNKNOWN_WINDOW_MS) * UNKNOWN_WINDOW_MS);
    const path = truncateHeaderText(e.path);
    await getDb().transaction().execute(async (tx) => {
      const row = await tx
        .insertInto("refused_request_tally")
        .values({ window_start: windowStart, kind: "unknown-token", origin: e.address, last_path: path, last_at: now })
        .onConflict((oc) => oc.columns(["window_start", "kind", "origin"]).doUpdateSet({ count: sql`refused_request_tally.count + 1`, last_path: path, last_at: now }))
        .returning("count")
        .executeTakeFirstOrThrow();
      if (row.count !== 1) return;
      await recordAuditEvent(tx, {
        actorId: null,
        actorLabel: "unknown caller",
        action: "machine-token.unknown",
        detail: {
          path,
          token: e.sent ? "a token that is not known" : "no token",
          note: `Further requests from this address with an unknown token until ${new Date(windowStart.getTime() + UNKNOWN_WINDOW_MS).toISOString()} are counted, not written one by one (Administration → Sign-in security).`,
        },
        address: e.address,
      });
    });
  } catch (error) {
    console.error("could not record a request with an unknown token", error);
  }
}
