import { randomBytes } from "node:crypto";
import { describe, expect, it } from "vitest";
import { nameSealingKey, readSealingKey, SealedSecretRefused, sealBytes, unsealBytes } from "@/lib/certificates/sealed-secret";

const key = randomBytes(32);
const plain = Buffer.from("a PKCS#12 file stands here \u0000\u00ff with every byte value", "latin1");

describe("sealing the lab's signing key (AES-256-GCM)", () => {
  it("opens what it sealed, byte for byte, and never seals the same way twice", () => {
    const sealed = sealBytes(key, plain, "lab_signing_key/1/p12");
    expect(Buffer.compare(unsealBytes(key, sealed, "lab_signing_key/1/p12"), plain)).toBe(0);
    // Version byte, 12-byte IV, ciphertext as long as the plain text, 16-byte tag.
    expect(sealed.length).toBe(1 + 12 + plain.length + 16);
    expect(sealed.includes(plain.subarray(0, 16))).toBe(false);
    expect(sealBytes(key, plain, "lab_signing_key/1/p12").equals(sealed)).toBe(false);
  });

  it("refuses in plain words under another key, with a changed byte, or as another field's value", () => {
    const sealed = sealBytes(key, plain, "lab_signing_key/1/p12");
    const refusal = /does not open with this key: it was sealed with another key, or it has been changed/;
    expect(() => unsealBytes(randomBytes(32), sealed, "lab_signing_key/1/p12")).toThrow(SealedSecretRefused);
    expect(() => unsealBytes(randomBytes(32), sealed, "lab_signing_key/1/p12")).toThrow(refusal);
    const changed = Buffer.from(sealed);
    changed[20] = (changed[20]! + 1) % 256;
    expect(() => unsealBytes(key, changed, "lab_signing_key/1/p12")).toThrow(refusal);
    const changedTag = Buffer.from(sealed);
    changedTag[changedTag.length - 1] = (changedTag[changedTag.length - 1]! + 1) % 256;
    expect(() => unsealBytes(key, changedTag, "lab_signing_key/1/p12")).toThrow(refusal);
    expect(() => unsealBytes(key, sealed, "lab_signing_key/1/passphrase")).toThrow(refusal);
    expect(() => unsealBytes(key, sealed.subarray(0, 20), "lab_signing_key/1/p12")).toThrow(/not a sealed secret/);
  });

  it("reads the key setting as 64 hex digits or base64 of 32 bytes, and says how to make one otherwise", () => {
    expect(readSealingKey(key.toString("hex")).equals(key)).toBe(true);
    expect(readSealingKey(` ${key.toString("base64")}\n`).equals(key)).toBe(true);
    expect(readSealingKey(key.toString("base64url")).equals(key)).toBe(true);
    expect(() => readSealingKey(undefined)).toThrow(/CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY is not set/);
    expect(() => readSealingKey(randomBytes(16).toString("base64"))).toThrow(/must be 32 bytes/);
    expect(() => readSealingKey("not a key at all")).toThrow(/head -c 32 \/dev\/urandom \| base64/);
  });

  it("names a key without revealing it, the same name for the same key", () => {
    expect(nameSealingKey(key)).toMatch(/^[0-9a-f]{16}$/);
    expect(nameSealingKey(Buffer.from(key))).toBe(nameSealingKey(key));
    expect(nameSealingKey(randomBytes(32))).not.toBe(nameSealingKey(key));
    expect(key.toString("hex")).not.toContain(nameSealingKey(key));
  });
});
