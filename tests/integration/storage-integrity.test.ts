import { randomBytes } from "node:crypto";
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { GetObjectCommand, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { Kysely, Migrator, PostgresDialect, sql } from "kysely";
import pg from "pg";
import { PDFDocument } from "pdf-lib";
import { afterAll, describe, expect, it } from "vitest";
import { getDb, type Database } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getCellSpecification } from "@/db/cell-specifications";
import { INTEGRITY_FAULT_ACTION, readVerifiedFile } from "@/lib/integrity/read-verified-file";
import { repairFramedObjects, unframeAwsChunked } from "@/lib/integrity/repair-framed-objects";
import { verifyAuditChain } from "@/lib/integrity/verify-audit-chain";
import { verifyStoredFiles } from "@/lib/integrity/verify-stored-files";
import { attachDatasheet, createCellSpecification } from "@/lib/specs/cell-specifications";
import { deleteObject, putObject, readObjectOrNull, sha256Hex } from "@/lib/storage";
import { backup } from "../../scripts/backup";
import { RestoreRefused, restore } from "../../scripts/restore";
import { MIGRATIONS } from "../../migrations";
import { adminUrl } from "../support/test-database";
import { inventedCell } from "@/scenarios/rated-capacity-run";
import { makeUser } from "./fixtures";

const scratch = mkdtempSync(join(tmpdir(), "cellwright-integrity-"));
const databaseName = new URL(process.env.DATABASE_URL!).pathname.slice(1);
// Tampering and backups act as the cluster's superuser, never as the app.
const superUrl = (database = databaseName) => adminUrl(process.env.TEST_DATABASE_URL!, database);
const pgBin = `/usr/lib/postgresql/${readdirSync("/usr/lib/postgresql").sort().at(-1)}/bin`;
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

async function asSuperuser<T>(fn: (c: pg.Client) => Promise<T>, database = databaseName): Promise<T> {
  const c = new pg.Client({ connectionString: superUrl(database) });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

const s3 = (secretAccessKey = process.env.S3_SECRET_ACCESS_KEY!) =>
  new S3Client({ endpoint: process.env.S3_ENDPOINT, region: "us-east-1", forcePathStyle: true, credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID!, secretAccessKey } });
const bucket = process.env.S3_BUCKET ?? "cellwright";

/**
 * A real PDF (the datasheet upload opens it with pdf-lib) larger than three 64 KiB chunks: one page and
 * 200 KiB of random bytes as an attached file, so no two are alike and compression cannot shrink it.
 */
async function bigPdf(): Promise<Buffer> {
  const doc = await PDFDocument.create();
  doc.addPage([595, 842]);
  await doc.attach(randomBytes(200 * 1024), "noise.bin", { mimeType: "application/octet-stream" });
  return Buffer.from(await doc.save());
}

async function specWithDatasheet(tag: string) {
  const engineer = await makeUser("engineer", `Eve ${tag}`);
  const id = await createCellSpecification(engineer, { maker: "Testmoor Cells", model: `TM-${tag}`, data: inventedCell });
  const bytes = await bigPdf();
  const stored = await attachDatasheet(engineer, id, { name: `${tag}.pdf`, bytes });
  const file = await getDb().selectFrom("stored_file").select(["id", "storage_key"]).where("id", "=", stored.fileId).executeTakeFirstOrThrow();
  return { engineer, id, bytes, fileId: file.id, key: file.storage_key };
}

describe("the local S3 stand-in", () => {
  it("refuses anonymous and wrongly signed requests, and writes nothing for them", async () => {
    const key = `probe/${randomBytes(4).toString("hex")}.bin`;
    const url = `${process.env.S3_ENDPOINT}/${bucket}/${key}`;
    const put = await fetch(url, { method: "PUT", body: "anonymous" });
    expect(put.status).toBe(403);
    expect(await put.text()).toContain("AccessDenied");
    await putObject(key, Buffer.from("signed"), "text/plain");
    const get = await fetch(url);
    expect(get.status).toBe(403);
    expect((await fetch(`${process.env.S3_ENDPOINT}/${bucket}?list-type=2`)).status).toBe(403);
    const wrong = await s3("not-the-secret").send(new GetObjectCommand({ Bucket: bucket, Key: key })).catch((e: unknown) => e);
    expect((wrong as Error).name).toBe("SignatureDoesNotMatch");
    await expect(s3("not-the-secret").send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: "overwrite" }))).rejects.toThrow();
    expect(Buffer.from((await readObjectOrNull(key))!).toString()).toBe("signed");
    await deleteObject(key);
  });

  it("stores what a client with default checksums sends (aws-chunked framing) as the bytes sent, like the real service", async () => {
    const key = `probe/${randomBytes(4).toString("hex")}.csv`;
    const bytes = Buffer.from("t,v,i\n" + Array.from({ length: 20_000 }, (_, i) => `${i},3.${i % 10},1.0`).join("\n"));
    expect(bytes.byteLength).toBeGreaterThan(3 * 64 * 1024);
    // A default client frames a stream body as aws-chunked with a trailing CRC32.
    const { Readable } = await import("node:stream");
    await s3().send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: Readable.from([bytes]), ContentLength: bytes.byteLength }));
    const back = await readObjectOrNull(key);
    expect(Buffer.compare(Buffer.from(back!), bytes)).toBe(0);
    await deleteObject(key);
  });
});

describe("stored files are checked on every read", () => {
  it("a datasheet larger than one 64 KiB chunk reads back byte for byte", async () => {
    const { bytes, fileId, id } = await specWithDatasheet("ROUND");
    expect(bytes.byteLength).toBeGreaterThan(64 * 1024);
    const read = await readVerifiedFile(fileId);
    expect(Buffer.compare(Buffer.from(read.bytes), bytes)).toBe(0);
    expect(read.file.sha256).toBe(sha256Hex(bytes));
    expect(read.file.record).toBe("the datasheet “ROUND.pdf” of Testmoor Cells TM-ROUND");
    expect((await getCellSpecification(getDb(), id))?.datasheet?.sha256).toBe(sha256Hex(bytes));
  });

  it("refuses a changed or missing datasheet with a message naming it, and writes the refusal to the audit trail", async () => {
    const { bytes, fileId, key, engineer } = await specWithDatasheet("TAMPER");
    const changed = Buffer.from(bytes);
    changed[70_000]! ^= 0x01;
    await putObject(key, changed, "application/pdf");
    const refused = (await readVerifiedFile(fileId, engineer, "datasheet download").then(() => null, (e: unknown) => e)) as Error & { code?: string };
    expect(refused).toMatchObject({ code: "integrity" });
    expect(refused.message).toBe(
      "The stored copy of the datasheet “TAMPER.pdf” of Testmoor Cells TM-TAMPER does not match the SHA-256 recorded when it was stored: it has been changed outside Cellwright. It is not handed out; the fault is recorded for the administrators.",
    );
    await deleteObject(key);
    await expect(readVerifiedFile(fileId)).rejects.toThrow("The stored copy of the datasheet “TAMPER.pdf” of Testmoor Cells TM-TAMPER is missing from the file store.");
    const faults = await getDb().selectFrom("audit_event").select(["actor_id", "actor_label", "detail"]).where("action", "=", INTEGRITY_FAULT_ACTION).where("entity_id", "=", fileId).orderBy("id").execute();
    expect(faults.map((f) => [f.actor_id, (f.detail as { problem: string }).problem])).toEqual([
      [engineer.id, "content does not match the recorded SHA-256"],
      [null, "missing from the file store"],
    ]);
    expect((faults[0]!.detail as Record<string, unknown>)).toMatchObject({ recordedSha256: sha256Hex(bytes), foundSha256: sha256Hex(changed), during: "datasheet download" });
    // verify names it too; putting the recorded bytes back heals it.
    expect((await verifyStoredFiles(getDb())).faults.map((f) => f.message)).toContain("The stored copy of the datasheet “TAMPER.pdf” of Testmoor Cells TM-TAMPER is missing from the file store.");
    await putObject(key, bytes, "application/pdf");
    expect((await verifyStoredFiles(getDb())).faults).toEqual([]);
  });

  it("repairs an object stored with aws-chunked framing around the bytes sent (demo databases made before the fix)", async () => {
    const { bytes, fileId, key } = await specWithDatasheet("FRAMED");
    const framed = Buffer.concat([Buffer.from("10000\r\n"), bytes.subarray(0, 0x10000), Buffer.from(`\r\n${(bytes.byteLength - 0x10000).toString(16)}\r\n`), bytes.subarray(0x10000), Buffer.from("\r\n0\r\nx-amz-checksum-crc32:AAAAAA==\r\n\r\n")]);
    expect(Buffer.compare(Buffer.from(unframeAwsChunked(framed)!), bytes)).toBe(0);
    expect(unframeAwsChunked(bytes)).toBeNull();
    await putObject(key, framed, "application/pdf");
    await expect(readVerifiedFile(fileId)).rejects.toThrow(/does not match/);
    const result = await repairFramedObjects("test repair");
    expect(result).toEqual({ repaired: ["repaired the datasheet “FRAMED.pdf” of Testmoor Cells TM-FRAMED"], unrepaired: [] });
    expect(Buffer.compare(Buffer.from((await readVerifiedFile(fileId)).bytes), bytes)).toBe(0);
    expect(await getDb().selectFrom("audit_event").select("actor_label").where("action", "=", "storage.repair").where("entity_id", "=", fileId).execute()).toEqual([{ actor_label: "test repair" }]);
  });
});

describe("backup and restore", () => {
  it("backs up, survives a wiped store, restores into a fresh database where every hash verifies; a changed byte is refused", async () => {
    await specWithDatasheet("BACKUP");
    const folder = join(scratch, "backup");
    const made = await backup({ databaseUrl: superUrl(), out: folder, pgBin, log: () => {} });
    expect(made.faults).toEqual([]);
    const recorded = await getDb().selectFrom("stored_file").select(["storage_key", "sha256"]).execute();
    expect(recorded.length).toBeGreaterThan(0);
    for (const r of recorded) expect(sha256Hex(readFileSync(join(folder, "objects", r.storage_key)))).toBe(r.sha256);

    // Wipe: every recorded object leaves the store.
    for (const r of recorded) await deleteObject(r.storage_key);
    expect((await verifyStoredFiles(getDb())).faults).toHaveLength(recorded.length);

    const restoredName = `${databaseName}_restored`;
    await restore({ folder, adminUrl: superUrl("postgres"), database: restoredName, pgBin, log: () => {} });
    const restored = new Kysely<Database>({ dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: superUrl(restoredName), max: 1 }) }) });
    try {
      const chain = await verifyAuditChain(restored);
      expect(chain.breaks).toEqual([]);
      expect(chain.head).toEqual((await verifyAuditChain(getDb())).head);
      const files = await verifyStoredFiles(restored);
      expect(files).toMatchObject({ checked: recorded.length, faults: [] });
    } finally {
      await restored.destroy();
    }
    // An existing database is never overwritten without --replace.
    await expect(restore({ folder, adminUrl: superUrl("postgres"), database: restoredName, pgBin, log: () => {} })).rejects.toThrow(RestoreRefused);

    // One byte changed anywhere in the folder: refused before anything is touched, naming the file.
    const victim = recorded[0]!.storage_key;
    const path = join(folder, "objects", victim);
    const bytes = readFileSync(path);
    bytes[10]! ^= 0x20;
    writeFileSync(path, bytes);
    const refused = (await restore({ folder, adminUrl: superUrl("postgres"), database: `${databaseName}_second`, pgBin, log: () => {} }).then(() => null, (e: unknown) => e)) as RestoreRefused;
    expect(refused).toBeInstanceOf(RestoreRefused);
    expect(refused.problems).toEqual([expect.stringMatching(new RegExp(`^objects/${victim.replace(/[.]/g, "\\.")} has been changed since the backup was made`))]);
    await asSuperuser(async (c) => {
      expect((await c.query("select 1 from pg_database where datname = $1", [`${databaseName}_second`])).rowCount).toBe(0);
      await c.query(`drop database ${restoredName} with (force)`);
    }, "postgres");
  }, 60_000);
});

describe("the audit trail's hash chain", () => {
  const actor = { actorId: null, actorLabel: "chain test" };

  it("chains the rows an older database already holds when migration 0010 runs", async () => {
    const name = `${databaseName}_old`;
    // An older database as the scripts keep it: owned by the owner role, which runs the migrations.
    await asSuperuser((c) => c.query(`create database ${name} owner cellwright_owner`), "postgres");
    const ownerUrl = adminUrl(process.env.TEST_OWNER_DATABASE_URL!, name);
    const old = new Kysely<Database>({ dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: ownerUrl, max: 1 }) }) });
    try {
      const migrator = new Migrator({ db: old, provider: { getMigrations: async () => MIGRATIONS } });
      expect((await migrator.migrateTo("0006_lot_sampling")).error).toBeUndefined();
      await sql`insert into audit_event (actor_label, action, after) values ('old', 'test.a', '{"b": 1, "a": [1, 2]}'), ('old', 'test.b', null), ('old', 'test.c', '"x"')`.execute(old);
      expect((await migrator.migrateToLatest()).error).toBeUndefined();
      const report = await verifyAuditChain(old);
      expect(report).toMatchObject({ rows: 3, breaks: [], head: { position: "3" } });
      await recordAuditEvent(old, { ...actor, action: "test.d" });
      expect((await verifyAuditChain(old)).rows).toBe(4);
      expect((await verifyAuditChain(old)).breaks).toEqual([]);
    } finally {
      await old.destroy();
      await asSuperuser((c) => c.query(`drop database ${name} with (force)`), "postgres");
    }
  });

  it("chains concurrent inserts into one line", async () => {
    await Promise.all(Array.from({ length: 24 }, (_, i) => getDb().transaction().execute((tx) => recordAuditEvent(tx, { ...actor, action: "test.concurrent", detail: { i } }))));
    const report = await verifyAuditChain(getDb());
    expect(report.breaks).toEqual([]);
    const { n } = await getDb().selectFrom("audit_event").select((eb) => eb.fn.countAll<string>().as("n")).executeTakeFirstOrThrow();
    expect(report.rows).toBe(Number(n));
    expect(report.head?.position).toBe(n);
  });

  it("ignores chain values a client sends", async () => {
    await getDb().insertInto("audit_event").values({ actor_id: null, actor_label: "forger", action: "test.forge", chain_position: "1", prev_hash: "f".repeat(64), row_hash: "e".repeat(64) }).execute();
    expect((await verifyAuditChain(getDb())).breaks).toEqual([]);
  });

  it("names the row a superuser changed with the append-only trigger disabled, and a row removed", async () => {
    await recordAuditEvent(getDb(), { ...actor, action: "test.target", after: { capacityMah: 5012 } });
    const target = await getDb().selectFrom("audit_event").select(["id", "chain_position"]).where("action", "=", "test.target").executeTakeFirstOrThrow();
    await recordAuditEvent(getDb(), { ...actor, action: "test.after" });
    await asSuperuser(async (c) => {
      await c.query("alter table audit_event disable trigger audit_event_no_update_delete");
      await c.query(`update audit_event set after = '{"capacityMah": 5120}' where id = $1`, [target.id]);
      await c.query("alter table audit_event enable trigger audit_event_no_update_delete");
    });
    let report = await verifyAuditChain(getDb());
    expect(report.breaks).toHaveLength(1);
    expect(report.breaks[0]).toMatchObject({ id: target.id, position: target.chain_position, action: "test.target", problem: expect.stringContaining("changed after it was written") });

    // The same edit with the hash recomputed moves the break to the link after it.
    await asSuperuser(async (c) => {
      await c.query("alter table audit_event disable trigger audit_event_no_update_delete");
      await c.query("update audit_event e set row_hash = audit_event_chain_hash(e.prev_hash, e) where id = $1", [target.id]);
      await c.query("alter table audit_event enable trigger audit_event_no_update_delete");
    });
    report = await verifyAuditChain(getDb());
    expect(report.breaks.map((b) => [b.action, b.problem.slice(0, 40)])).toEqual([["test.after", "Its link to the row before does not matc"]]);

    // A removed row leaves a gap that is named at the row after it.
    await asSuperuser(async (c) => {
      await c.query("alter table audit_event disable trigger audit_event_no_update_delete");
      await c.query("delete from audit_event where id = $1", [target.id]);
      await c.query("alter table audit_event enable trigger audit_event_no_update_delete");
    });
    report = await verifyAuditChain(getDb());
    expect(report.breaks[0]).toMatchObject({ action: "test.after", problem: expect.stringContaining("audit rows were removed") });
  });
});
