import "server-only";
import { z } from "zod";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { countRecentFailures, recordSignInAttempt } from "@/db/sign-in-attempts";
import { getUserCredentials } from "@/db/users";
import { getDecoyHash, verifyPassword } from "./password";
import { createSession } from "./session";
import type { SignedInUser } from "./signed-in-user";

export const signInSchema = z.object({
  email: z.email("Enter the e-mail address of your account.").transform((e) => e.toLowerCase()),
  password: z.string().min(1, "Enter your password.").max(256),
});
export type SignInInput = z.infer<typeof signInSchema>;

/**
 * Failures counted in a sliding window. One address may fail 5 times for one account and 20 times across
 * accounts before it is refused; an account failing from many addresses is slowed down, never locked,
 * so nobody can lock a colleague out by typing wrong passwords (issue 11 row 5).
 */
export const SIGN_IN_LIMITS = { windowMinutes: 15, perAccountAndAddress: 5, perAddress: 20, slowDownAfter: 5, maxDelayMs: 4000 } as const;

/** The pause before checking a password for an account with `failures` recent failures from anywhere. */
export function signInDelayMs(failures: number): number {
  if (failures < SIGN_IN_LIMITS.slowDownAfter) return 0;
  return Math.min(250 * 2 ** (failures - SIGN_IN_LIMITS.slowDownAfter), SIGN_IN_LIMITS.maxDelayMs);
}

export type SignInResult =
  | { ok: true; sessionId: string; user: SignedInUser }
  | { ok: false; reason: "invalid" | "deactivated" | "rate-limited"; message: string };

const INVALID = "The e-mail address or the password is not right.";
const sleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

/**
 * Checks the credentials and, on success, opens a session. Every attempt is recorded (for rate
 * limiting) and audited in the same transaction as its outcome.
 */
export async function signIn(input: SignInInput & { address: string; client?: string; now?: Date; pause?: (ms: number) => Promise<void> }): Promise<SignInResult> {
  const { email, password, address } = input;
  const now = input.now ?? new Date();
  const since = new Date(now.getTime() - SIGN_IN_LIMITS.windowMinutes * 60_000);
  // The pause comes before the transaction, so a slowed sign-in holds no database connection.
  const delay = signInDelayMs((await countRecentFailures(getDb(), { email, address, since })).byEmail);
  if (delay > 0) await (input.pause ?? sleep)(delay);

  return getDb().transaction().execute(async (tx) => {
    const failures = await countRecentFailures(tx, { email, address, since });
    const account = await getUserCredentials(tx, email);
    const fail = async (reason: "invalid" | "deactivated" | "rate-limited", message: string): Promise<SignInResult> => {
      await recordSignInAttempt(tx, { email, address, succeeded: false });
      await recordAuditEvent(tx, {
        actorId: account?.id ?? null,
        actorLabel: account ? `${account.displayName} <${account.email}>` : email,
        action: reason === "rate-limited" ? "auth.sign-in-refused" : "auth.sign-in-failed",
        entityType: account ? "user" : undefined,
        entityId: account?.id,
        detail: { reason, ...(delay > 0 && { slowedDownMs: delay }) },
        address,
      });
      return { ok: false, reason, message };
    };

    if (failures.byPair >= SIGN_IN_LIMITS.perAccountAndAddress || failures.byAddress >= SIGN_IN_LIMITS.perAddress) {
      return fail(
        "rate-limited",
        `Too many failed sign-ins from this computer. Wait ${SIGN_IN_LIMITS.windowMinutes} minutes, or ask your lab's administrator to clear the limit.`,
      );
    }
    // Verify against a decoy when the account is unknown so timing does not reveal which e-mails exist.
    const passwordOk = await verifyPassword(account?.passwordHash ?? (await getDecoyHash()), password);
    if (!account || !passwordOk) return fail("invalid", INVALID);
    if (!account.active) {
      return fail("deactivated", "This account has been deactivated. Ask your lab's administrator.");
    }

    const sessionId = await createSession(tx, account.id, { address, client: input.client });
    await recordSignInAttempt(tx, { email, address, succeeded: true });
    await recordAuditEvent(tx, {
      actorId: account.id,
      actorLabel: `${account.displayName} <${account.email}>`,
      action: "auth.sign-in",
      entityType: "user",
      entityId: account.id,
      address,
    });
    const user: SignedInUser = { id: account.id, email: account.email, displayName: account.displayName, role: account.role };
    return { ok: true, sessionId, user };
  });
}
