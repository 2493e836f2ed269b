import { createCipheriv, createDecipheriv, createHash, randomBytes } from "node:crypto";

/**
 * Secrets kept in the database (the lab's signing key) are sealed with AES-256-GCM under a key that
 * lives only in the servers' environment, so a copy of the database alone signs nothing.
 * Layout of a sealed value: 1 byte format version, 12-byte IV (NIST SP 800-38D 8.2: 96-bit IVs,
 * random, one per seal), the ciphertext, the 16-byte authentication tag. The associated data names
 * what the value is (and its record), so a sealed value moved to another field does not open.
 */
const FORMAT = 1;
const IV_BYTES = 12;
const TAG_BYTES = 16;

export const SEALING_KEY_SETTING = "CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY";

/** A sealed value that does not open: another key, a changed byte, or another record's value. */
export class SealedSecretRefused extends Error {
  constructor(message: string) {
    super(message);
    this.name = "SealedSecretRefused";
  }
}

/** Reads the 32-byte key from its setting: 64 hexadecimal digits or base64 (standard or URL-safe). */
export function readSealingKey(text: string | undefined): Buffer {
  const value = text?.trim() ?? "";
  if (!value) throw new Error(`The server setting ${SEALING_KEY_SETTING} is not set: it must hold the 32-byte key that protects the lab's signing key.`);
  const bytes = /^[0-9a-fA-F]{64}$/.test(value) ? Buffer.from(value, "hex") : /^[A-Za-z0-9+/_-]+=*$/.test(value) ? Buffer.from(value, "base64") : Buffer.alloc(0);
  if (bytes.length !== 32) {
    throw new Error(`The server setting ${SEALING_KEY_SETTING} must be 32 bytes, written as 64 hexadecimal digits or in base64 (for example: head -c 32 /dev/urandom | base64).`);
  }
  return bytes;
}

/** A short name of a sealing key (not the key): tells which key sealed a value without revealing it. */
export function nameSealingKey(key: Buffer): string {
  return createHash("sha256").update("cellwright sealing key\0").update(key).digest("hex").slice(0, 16);
}

export function sealBytes(key: Buffer, plain: Buffer, associatedData: string): Buffer {
  const iv = randomBytes(IV_BYTES);
  const cipher = createCipheriv("aes-256-gcm", key, iv, { authTagLength: TAG_BYTES });
  cipher.setAAD(Buffer.from(associatedData, "utf8"));
  const body = Buffer.concat([cipher.update(plain), cipher.final()]);
  return Buffer.concat([Buffer.from([FORMAT]), iv, body, cipher.getAuthTag()]);
}

/** Opens a sealed value, or refuses in plain words; never returns bytes that did not authenticate. */
export function unsealBytes(key: Buffer, sealed: Buffer, associatedData: string): Buffer {
  if (sealed.length < 1 + IV_BYTES + TAG_BYTES || sealed[0] !== FORMAT) {
    throw new SealedSecretRefused("The stored value is not a sealed secret this version of Cellwright can read.");
  }
  const iv = sealed.subarray(1, 1 + IV_BYTES);
  const tag = sealed.subarray(sealed.length - TAG_BYTES);
  const decipher = createDecipheriv("aes-256-gcm", key, iv, { authTagLength: TAG_BYTES });
  decipher.setAAD(Buffer.from(associatedData, "utf8"));
  decipher.setAuthTag(tag);
  try {
    return Buffer.concat([decipher.update(sealed.subarray(1 + IV_BYTES, sealed.length - TAG_BYTES)), decipher.final()]);
  } catch {
    throw new SealedSecretRefused("The stored value does not open with this key: it was sealed with another key, or it has been changed.");
  }
}
