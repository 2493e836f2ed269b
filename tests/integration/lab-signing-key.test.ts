import { createHash, randomBytes } from "node:crypto";
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { upsertLab } from "@/db/lab";
import { closePool } from "@/db/pool";
import { describeLabSigningKey, LabSigningKeyUnavailable, loadLabSigningKey } from "@/lib/certificates/lab-signing-key";
import { unsealBytes } from "@/lib/certificates/sealed-secret";
import { createSelfSignedP12 } from "@/lib/certificates/self-signed-p12";
import { withOwnerClient } from "../support/test-database";

// The lab's signing key lives in the database, sealed under a key from the servers' environment, so every
// app server signs with the same key. This file's database starts with a key left in the old data folder:
// the first load moves it in; later loads (any server) read it back from the database.

const sealingKey = randomBytes(32);
process.env.CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY = sealingKey.toString("base64");
delete process.env.CELLWRIGHT_SIGNING_P12;
const signingDir = mkdtempSync(join(tmpdir(), "cellwright-signing-"));
process.env.CELLWRIGHT_SIGNING_DIR = signingDir;
const legacyP12 = createSelfSignedP12("Harbourside Cell Test Laboratory", "an old passphrase");

/** A new process: nothing cached, so the key is read from the database again. */
function forgetCachedKeys(): void {
  (globalThis as { cellwrightSigningKeys?: Map<string, unknown> }).cellwrightSigningKeys?.clear();
}

beforeAll(async () => {
  await upsertLab(getDb(), { name: "Harbourside Cell Test Laboratory", address: "Unit 4, 17 Ropewalk Lane, Portmere", accreditation: null });
  const database = new URL(process.env.DATABASE_URL!).pathname.slice(1);
  mkdirSync(join(signingDir, database), { recursive: true });
  writeFileSync(join(signingDir, database, "lab.p12"), legacyP12);
  writeFileSync(join(signingDir, database, "lab.passphrase"), "an old passphrase\n");
});

afterAll(async () => {
  rmSync(signingDir, { recursive: true, force: true });
  await closePool();
  await new Promise((resolve) => setTimeout(resolve, 300));
});

async function refusal(statement: ReturnType<typeof sql>): Promise<string | null> {
  try {
    await statement.execute(getDb());
    return null;
  } catch (error) {
    return (error as Error).message;
  }
}

describe("the lab's signing key in the database", () => {
  it("moves a key from the old data folder into the database once, sealed, and reads back the same bytes", async () => {
    const key = await loadLabSigningKey();
    expect(Buffer.compare(key.p12, legacyP12)).toBe(0);
    expect(key).toMatchObject({ source: "generated", location: "the database (sealed)", commonName: "Harbourside Cell Test Laboratory" });

    const row = await getDb().selectFrom("lab_signing_key").selectAll().executeTakeFirstOrThrow();
    expect(row.origin).toBe("imported");
    expect(row.p12_sha256).toBe(createHash("sha256").update(legacyP12).digest("hex"));
    expect(row.certificate_sha256).toBe(key.fingerprintSha256);
    // At rest: neither the file nor its passphrase appears in the row.
    expect(row.sealed_p12.includes(legacyP12.subarray(100, 132))).toBe(false);
    expect(row.sealed_passphrase.includes(Buffer.from("an old passphrase"))).toBe(false);
    // Read back from the database and opened with the environment's key: byte for byte the file that was there.
    expect(Buffer.compare(unsealBytes(sealingKey, row.sealed_p12, `lab_signing_key/${row.id}/p12`), legacyP12)).toBe(0);
    expect(unsealBytes(sealingKey, row.sealed_passphrase, `lab_signing_key/${row.id}/passphrase`).toString()).toBe("an old passphrase");

    const trail = await listAuditEvents(getDb(), { entityType: "lab-signing-key", entityId: row.id });
    expect(trail.map((e) => e.action)).toEqual(["signing-key.import"]);
  });

  it("gives a second server (a fresh process, no data folder) the same key from the database, still one row", async () => {
    const first = await loadLabSigningKey();
    forgetCachedKeys();
    rmSync(signingDir, { recursive: true, force: true });
    const [a, b] = await Promise.all([loadLabSigningKey(), describeLabSigningKey()]);
    expect(Buffer.compare(a.p12, first.p12)).toBe(0);
    expect(b.fingerprintSha256).toBe(first.fingerprintSha256);
    const count = await getDb().selectFrom("lab_signing_key").select((eb) => eb.fn.countAll<string>().as("n")).executeTakeFirstOrThrow();
    expect(Number(count.n)).toBe(1);
  });

  it("refuses in plain words when the server's encryption key is not the one the key was sealed with", async () => {
    forgetCachedKeys();
    process.env.CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY = randomBytes(32).toString("hex");
    try {
      await expect(loadLabSigningKey()).rejects.toThrow(LabSigningKeyUnavailable);
      forgetCachedKeys();
      await expect(loadLabSigningKey()).rejects.toThrow(/sealed with another encryption key .* than this server's CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY/);
      forgetCachedKeys();
      delete process.env.CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY;
      await expect(loadLabSigningKey()).rejects.toThrow(/CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY is not set/);
    } finally {
      process.env.CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY = sealingKey.toString("base64");
      forgetCachedKeys();
    }
    // Nothing was stored or changed by the refusals.
    const rows = await getDb().selectFrom("lab_signing_key").select("p12_sha256").execute();
    expect(rows).toEqual([{ p12_sha256: createHash("sha256").update(legacyP12).digest("hex") }]);
  });

  it("cannot be overwritten, removed or joined by a second key from the app's role", async () => {
    const other = randomBytes(64);
    expect(await refusal(sql`update lab_signing_key set sealed_p12 = ${other}`)).toMatch(/permission denied/);
    expect(await refusal(sql`update lab_signing_key set subject = 'CN=someone else'`)).toMatch(/permission denied/);
    expect(await refusal(sql`delete from lab_signing_key`)).toMatch(/permission denied/);
    expect(await refusal(sql`truncate lab_signing_key`)).toMatch(/permission denied/);
    const row = await getDb().selectFrom("lab_signing_key").selectAll().executeTakeFirstOrThrow();
    expect(
      await refusal(sql`insert into lab_signing_key (id, origin, sealed_p12, sealed_passphrase, sealing_key_name, p12_sha256, certificate_sha256, subject, valid_from, valid_to)
        values (gen_random_uuid(), 'generated', ${other}, ${other}, ${row.sealing_key_name}, ${row.p12_sha256}, ${row.certificate_sha256}, 'CN=x', now(), now())`),
    ).toMatch(/duplicate key value violates unique constraint "lab_signing_key_one"/);
    const after = await getDb().selectFrom("lab_signing_key").selectAll().executeTakeFirstOrThrow();
    expect(Buffer.compare(after.sealed_p12, row.sealed_p12)).toBe(0);
  });

  it("is kept by a trigger against the owner role too", async () => {
    await withOwnerClient(async (c) => {
      await expect(c.query("update lab_signing_key set subject = 'CN=someone else'")).rejects.toThrow(/never changed or removed/);
      await expect(c.query("delete from lab_signing_key")).rejects.toThrow(/never changed or removed/);
      await expect(c.query("truncate lab_signing_key")).rejects.toThrow(/never changed or removed/);
    });
    forgetCachedKeys();
    expect(Buffer.compare((await loadLabSigningKey()).p12, legacyP12)).toBe(0);
  });
});
