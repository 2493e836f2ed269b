/** How long a token lives unless the administrator says otherwise, and the longest allowed. */
export const TOKEN_DEFAULT_DAYS = 90;
export const TOKEN_MAX_DAYS = 365;
/** Requests one token may make per minute: a cycler pushing a part every few minutes needs a handful. */
export const TOKEN_REQUESTS_PER_MINUTE = 30;
const DAY_MS = 86_400_000;

export interface TokenState {
  expiresAt: Date;
  revokedAt: Date | null;
  revokeReason: string | null;
}

/** Whether a known token may be used now, and in plain words why not. */
export function refuseTokenUse(token: TokenState, now: Date): { code: "revoked" | "expired"; message: string } | null {
  if (token.revokedAt) {
    return { code: "revoked", message: `This token was revoked on ${formatDay(token.revokedAt)} (${token.revokeReason ?? "no reason given"}). Ask the lab's administrator for a new one.` };
  }
  if (token.expiresAt.getTime() <= now.getTime()) {
    return { code: "expired", message: `This token expired on ${formatDay(token.expiresAt)}. Ask the lab's administrator for a new one.` };
  }
  return null;
}

/** The expiry of a token issued now for `days` days; refused outside 1 … TOKEN_MAX_DAYS. */
export function tokenExpiry(now: Date, days: number): Date {
  if (!Number.isInteger(days) || days < 1 || days > TOKEN_MAX_DAYS) throw new RangeError(`A token lives 1 to ${TOKEN_MAX_DAYS} days.`);
  return new Date(now.getTime() + days * DAY_MS);
}

/** The start of the one-minute window `now` falls in: requests are counted per token and window. */
export function rateWindowStart(now: Date): Date {
  return new Date(Math.floor(now.getTime() / 60_000) * 60_000);
}

/** A token may only push for a run that lists its cycler channel among the run's instruments. */
export function tokenCoversRun(tokenInstrumentId: string, runInstrumentIds: readonly string[]): boolean {
  return runInstrumentIds.includes(tokenInstrumentId);
}

function formatDay(d: Date): string {
  return d.toISOString().slice(0, 10);
}
