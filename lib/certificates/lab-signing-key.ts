import "server-only";
import { randomBytes } from "node:crypto";
import { mkdir, readFile, rename, rm, writeFile } from "node:fs/promises";
import { join } from "node:path";
import forge from "node-forge";
import { getDb } from "@/db";
import { getLab } from "@/db/lab";
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

/** The file the key is kept in when none is configured: one per database, so tests and demo never share one. */
function generatedKeyDir(): string {
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

/**
 * Creates the key folder atomically: both files are written to a fresh folder that is then renamed
 * into place, so two processes starting at once end up with one key, never a key without its passphrase.
 */
async function createGeneratedKey(dir: string): Promise<void> {
  const lab = await getLab(getDb());
  const passphrase = randomBytes(24).toString("base64url");
  const p12 = createSelfSignedP12(lab?.name?.trim() || "Cellwright laboratory", passphrase);
  const staging = `${dir}.staging-${randomBytes(6).toString("hex")}`;
  await mkdir(staging, { recursive: true, mode: 0o700 });
  try {
    await writeFile(join(staging, "lab.p12"), p12, { mode: 0o600 });
    await writeFile(join(staging, "lab.passphrase"), passphrase, { mode: 0o600 });
    await rename(staging, dir);
  } catch (error) {
    await rm(staging, { recursive: true, force: true });
    const code = (error as NodeJS.ErrnoException).code;
    if (code !== "EEXIST" && code !== "ENOTEMPTY") throw error;
  }
}

async function loadFromDisk(): Promise<LabSigningKey> {
  const configured = process.env.CELLWRIGHT_SIGNING_P12?.trim();
  if (configured) {
    const p12 = await readFile(configured);
    return readP12(p12, process.env.CELLWRIGHT_SIGNING_PASSPHRASE ?? "", "configured", configured);
  }
  const dir = generatedKeyDir();
  const file = join(dir, "lab.p12");
  const exists = await readFile(file).then(
    () => true,
    (error: NodeJS.ErrnoException) => {
      if (error.code === "ENOENT") return false;
      throw error;
    },
  );
  if (!exists) {
    await mkdir(join(dir, ".."), { recursive: true, mode: 0o700 });
    await createGeneratedKey(dir);
  }
  const [p12, passphrase] = await Promise.all([readFile(file), readFile(join(dir, "lab.passphrase"), "utf8")]);
  return readP12(p12, passphrase.trim(), "generated", file);
}

const globalForKey = globalThis as unknown as { cellwrightSigningKeys?: Map<string, Promise<LabSigningKey>> };

/**
 * The lab's signing key: the PKCS#12 file named by CELLWRIGHT_SIGNING_P12 (with
 * CELLWRIGHT_SIGNING_PASSPHRASE), or else one generated on first use under .data/signing/<database>/.
 * Loaded once per process and per location.
 */
export function loadLabSigningKey(): Promise<LabSigningKey> {
  const cacheKey = process.env.CELLWRIGHT_SIGNING_P12?.trim() || generatedKeyDir();
  globalForKey.cellwrightSigningKeys ??= new Map();
  const cache = globalForKey.cellwrightSigningKeys;
  let loading = cache.get(cacheKey);
  if (!loading) {
    loading = loadFromDisk().catch((error: unknown) => {
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
