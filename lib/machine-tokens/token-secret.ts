import { createHash, randomBytes } from "node:crypto";

/** Every token starts with this, so a token pasted in the wrong place (a chat, a commit) is recognisable. */
export const TOKEN_PREFIX = "cwt_";
const SECRET_BYTES = 32;
/** base64url of 32 bytes: 43 characters. */
const TOKEN_PATTERN = /^cwt_[A-Za-z0-9_-]{43}$/;

/**
 * A new token: 32 random bytes (256 bits) from the operating system's generator, base64url-encoded,
 * and the part shown in lists so an administrator can tell tokens apart (the first 6 characters after
 * the prefix; what remains is still 214 random bits).
 */
export function makeTokenSecret(random: (n: number) => Uint8Array = randomBytes): { token: string; sha256: string; hint: string } {
  const token = TOKEN_PREFIX + Buffer.from(random(SECRET_BYTES)).toString("base64url");
  return { token, sha256: hashTokenSecret(token), hint: token.slice(0, TOKEN_PREFIX.length + 6) };
}

/**
 * What is stored and looked up: the SHA-256 of the token (hex). A password needs a slow hash (argon2)
 * because people choose guessable ones and a stolen hash can be tried against a dictionary; this token is
 * 256 random bits, so no dictionary exists and trying 2^255 SHA-256 inputs on average is out of reach
 * however fast each one is. A fast hash also lets the lookup use a unique index instead of trying each row.
 */
export function hashTokenSecret(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

export function looksLikeToken(value: string): boolean {
  return TOKEN_PATTERN.test(value);
}

/** The token of an `Authorization: Bearer …` header; null when the header is missing or of another kind. */
export function readBearerToken(header: string | null): string | null {
  const match = /^Bearer[ ]+(\S+)\s*$/i.exec(header ?? "");
  return match ? match[1]! : null;
}
