import "server-only";
import { hash, verify } from "@node-rs/argon2";
import { newPasswordSchema } from "./password-policy";

// OWASP password storage cheat sheet, argon2id minimum: m = 19 MiB, t = 2, p = 1.
const OPTIONS = { memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 } as const;

/** A new password: the rules of lib/auth/password-policy.ts (length, breached list; the e-mail rule where the account is known). */
export const passwordSchema = newPasswordSchema;

export function hashPassword(password: string): Promise<string> {
  return hash(password, OPTIONS);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

/** A hash of nothing in particular: verifying against it keeps unknown-user sign-ins as slow as real ones. */
let decoyHash: Promise<string> | undefined;
export function getDecoyHash(): Promise<string> {
  decoyHash ??= hashPassword("decoy password for timing");
  return decoyHash;
}
