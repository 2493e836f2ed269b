import "server-only";
import { createHash, randomBytes, randomUUID } from "node:crypto";
import { readFile } from "node:fs/promises";
import { join } from "node:path";
import forge from "node-forge";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getLab } from "@/db/lab";
import { getStoredLabSigningKey, insertLabSigningKey, type StoredLabSigningKey } from "@/db/lab-signing-key";
import { nameSealingKey, readSealingKey, SEALING_KEY_SETTING, sealBytes, SealedSecretRefused, unsealBytes } from "./sealed-secret";
import { createSelfSignedP12 } from "./self-signed-p12";
import { describeSubject, fingerprintCertificate, readCommonName } from "./x509-names";

/** The lab's signing identity: its PKCS#12 file, the certificate in it, and where it came from. */
export interface LabSigningKey {
  p12: Buffer;
  passphrase: string;
  certificate: forge.pki.Certificate;
  commonName: string;
  subject: string;
  fingerprintSha256: string;
  validFrom: Date;
  validTo: Date;
  source: "configured" | "generated";
  location: string;
}

/** What an admin page shows of the key: never the key itself or its passphrase. */
export type LabSigningKeyDescription = Pick<LabSigningKey, "commonName" | "subject" | "fingerprintSha256" | "validFrom" | "validTo" | "source" | "location">;

/**
 * Where keys lived before they moved into the database: one folder per database under .data/signing/.
 * A key found there is moved into the database once, so certificates signed before still match the lab's key.
 */
function legacyKeyDir(): string {
  const root = process.env.CELLWRIGHT_SIGNING_DIR?.trim() || join(process.cwd(), ".data", "signing");
  let database = "default";
  try {
    database = new URL(process.env.DATABASE_URL ?? "").pathname.replace(/^\//, "") || database;
  } catch {
    // No usable DATABASE_URL: one shared folder.
  }
  return join(root, database.replace(/[^\w.-]/g, "_"));
}

/** PKCS#12 bag types (RFC 7292 4.2). */
const SHROUDED_KEY_BAG = "1.2.840.113549.1.12.10.1.2";
const CERT_BAG = "1.2.840.113549.1.12.10.1.3";

function readP12(p12: Buffer, passphrase: string, source: LabSigningKey["source"], location: string): LabSigningKey {
  let parsed: forge.pkcs12.Pkcs12Pfx;
  try {
    parsed = forge.pkcs12.pkcs12FromAsn1(forge.asn1.fromDer(p12.toString("binary")), false, passphrase);
  } catch (error) {
    throw new Error(`The lab's signing key at ${location} cannot be opened (wrong passphrase or not a PKCS#12 file): ${(error as Error).message}`);
  }
  const keyBag = parsed.getBags({ bagType: SHROUDED_KEY_BAG })[SHROUDED_KEY_BAG]?.[0];
  const key = keyBag?.key as forge.pki.rsa.PrivateKey | undefined;
  const certificates = (parsed.getBags({ bagType: CERT_BAG })[CERT_BAG] ?? []).flatMap((b) => (b.cert ? [b.cert] : []));
  const certificate = certificates.find((c) => {
    const pub = c.publicKey as forge.pki.rsa.PublicKey;
    return key !== undefined && pub.n?.compareTo(key.n) === 0 && pub.e?.compareTo(key.e) === 0;
  });
  if (!key || !certificate) throw new Error(`The signing file at ${location} must hold an RSA private key and its certificate.`);
  return {
    p12,
    passphrase,
    certificate,
    commonName: readCommonName(certificate),
    subject: describeSubject(certificate),
    fingerprintSha256: fingerprintCertificate(certificate),
    validFrom: certificate.validity.notBefore,
    validTo: certificate.validity.notAfter,
    source,
    location,
  };
}

/** The associated data of each sealed field: names the field and its row, so no sealed value opens elsewhere. */
const sealedAs = (id: string, field: "p12" | "passphrase") => `lab_signing_key/${id}/${field}`;
const sha256 = (bytes: Buffer) => createHash("sha256").update(bytes).digest("hex");
const STORED_LOCATION = "the database (sealed)";

/** A key that is in the database but does not open: plain words for the admin, no key material. */
export class LabSigningKeyUnavailable extends Error {
  constructor(message: string) {
    super(message);
    this.name = "LabSigningKeyUnavailable";
  }
}

function openStoredKey(row: StoredLabSigningKey, sealingKey: Buffer): LabSigningKey {
  const name = nameSealingKey(sealingKey);
  if (row.sealing_key_name !== name) {
    throw new LabSigningKeyUnavailable(
      `The lab's signing key in the database was sealed with another encryption key (${row.sealing_key_name}) than this server's ${SEALING_KEY_SETTING} (${name}). Give every server the key the signing key was stored with.`,
    );
  }
  let p12: Buffer;
  let passphrase: string;
  try {
    p12 = unsealBytes(sealingKey, row.sealed_p12, sealedAs(row.id, "p12"));
    passphrase = unsealBytes(sealingKey, row.sealed_passphrase, sealedAs(row.id, "passphrase")).toString("utf8");
  } catch (error) {
    if (error instanceof SealedSecretRefused) throw new LabSigningKeyUnavailable(`The lab's signing key in the database cannot be opened: ${error.message}`);
    throw error;
  }
  if (sha256(p12) !== row.p12_sha256) throw new LabSigningKeyUnavailable("The lab's signing key in the database is not the file that was stored (its SHA-256 differs).");
  const key = readP12(p12, passphrase, "generated", STORED_LOCATION);
  if (key.fingerprintSha256 !== row.certificate_sha256) throw new LabSigningKeyUnavailable("The lab's signing key in the database does not hold the certificate recorded beside it.");
  return key;
}

/** A key to store: moved from the old data folder if one is there, otherwise a new self-signed one. */
async function makeFirstKey(): Promise<{ p12: Buffer; passphrase: string; origin: "generated" | "imported"; from: string | null }> {
  const dir = legacyKeyDir();
  const [p12, passphrase] = await Promise.all([readFile(join(dir, "lab.p12")), readFile(join(dir, "lab.passphrase"), "utf8")]).catch((error: NodeJS.ErrnoException) => {
    if (error.code === "ENOENT") return [null, null] as const;
    throw error;
  });
  if (p12 && passphrase !== null) return { p12, passphrase: passphrase.trim(), origin: "imported", from: join(dir, "lab.p12") };
  const lab = await getLab(getDb());
  const fresh = randomBytes(24).toString("base64url");
  return { p12: createSelfSignedP12(lab?.name?.trim() || "Cellwright laboratory", fresh), passphrase: fresh, origin: "generated", from: null };
}

/**
 * The stored key, storing the first one if there is none. Two servers doing this at once both make a
 * key; the database keeps the first (one row at most) and both go on with the one it kept. The key is
 * always the one read back from the database, after its hash and certificate were checked.
 */
async function loadFromDatabase(): Promise<LabSigningKey> {
  const sealingKey = readSealingKey(process.env[SEALING_KEY_SETTING]);
  const stored = await getStoredLabSigningKey(getDb());
  if (stored) return openStoredKey(stored, sealingKey);

  const made = await makeFirstKey();
  const key = readP12(made.p12, made.passphrase, "generated", made.from ?? STORED_LOCATION);
  const id = randomUUID();
  await getDb()
    .transaction()
    .execute(async (tx) => {
      const inserted = await insertLabSigningKey(tx, {
        id,
        origin: made.origin,
        sealed_p12: sealBytes(sealingKey, made.p12, sealedAs(id, "p12")),
        sealed_passphrase: sealBytes(sealingKey, Buffer.from(made.passphrase, "utf8"), sealedAs(id, "passphrase")),
        sealing_key_name: nameSealingKey(sealingKey),
        p12_sha256: sha256(made.p12),
        certificate_sha256: key.fingerprintSha256,
        subject: key.subject,
        valid_from: key.validFrom,
        valid_to: key.validTo,
      });
      if (!inserted) return;
      await recordAuditEvent(tx, {
        actorId: null,
        actorLabel: "this installation",
        action: made.origin === "imported" ? "signing-key.import" : "signing-key.generate",
        entityType: "lab-signing-key",
        entityId: id,
        after: { subject: key.subject, fingerprintSha256: key.fingerprintSha256, validTo: key.validTo.toISOString() },
      });
    });
  const kept = await getStoredLabSigningKey(getDb());
  if (!kept) throw new LabSigningKeyUnavailable("The lab's signing key could not be stored in the database.");
  return openStoredKey(kept, sealingKey);
}

async function loadKey(): Promise<LabSigningKey> {
  const configured = process.env.CELLWRIGHT_SIGNING_P12?.trim();
  if (configured) {
    const p12 = await readFile(configured);
    return readP12(p12, process.env.CELLWRIGHT_SIGNING_PASSPHRASE ?? "", "configured", configured);
  }
  return loadFromDatabase();
}

const globalForKey = globalThis as unknown as { cellwrightSigningKeys?: Map<string, Promise<LabSigningKey>> };

/**
 * The lab's signing key: the PKCS#12 file named by CELLWRIGHT_SIGNING_P12 (with
 * CELLWRIGHT_SIGNING_PASSPHRASE), or else the one kept sealed in the database (made on first use), which
 * every app server of the installation shares. Loaded once per process and per source.
 */
export function loadLabSigningKey(): Promise<LabSigningKey> {
  const cacheKey = process.env.CELLWRIGHT_SIGNING_P12?.trim() || `database ${process.env.DATABASE_URL ?? ""}`;
  globalForKey.cellwrightSigningKeys ??= new Map();
  const cache = globalForKey.cellwrightSigningKeys;
  let loading = cache.get(cacheKey);
  if (!loading) {
    loading = loadKey().catch((error: unknown) => {
      cache.delete(cacheKey);
      throw error;
    });
    cache.set(cacheKey, loading);
  }
  return loading;
}

/** Subject, SHA-256 fingerprint, validity and origin of the lab's signing certificate, for the admin page. */
export async function describeLabSigningKey(): Promise<LabSigningKeyDescription> {
  const key = await loadLabSigningKey();
  return {
    commonName: key.commonName,
    subject: key.subject,
    fingerprintSha256: key.fingerprintSha256,
    validFrom: key.validFrom,
    validTo: key.validTo,
    source: key.source,
    location: key.location,
  };
}
