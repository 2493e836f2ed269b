// `npm run backup [-- --profile demo|test] [--database NAME] [--out FOLDER]`: a consistent copy of one
// Cellwright database and its stored files, with a manifest of SHA-256 hashes. The database dump and the
// list of files to copy come from one snapshot (pg_dump --snapshot), so every file row in the dump has its
// object in the folder; each object is checked against the hash recorded at upload as it is copied.
import { spawn } from "node:child_process";
import { mkdir, writeFile } from "node:fs/promises";
import path from "node:path";
import pg from "pg";
import { listObjectKeys, readObjectOrNull, sha256Hex } from "../lib/storage";
import { formatManifest, MANIFEST, sha256File } from "./backup-manifest";

export interface BackupOptions {
  /** Superuser (or owner) URL of the database to back up. */
  databaseUrl: string;
  out: string;
  pgBin: string;
  log?: (line: string) => void;
}

export interface BackupResult {
  folder: string;
  files: number;
  objects: number;
  bytes: number;
  /** Stored files whose object did not match its recorded hash, or was missing: named, copied as found. */
  faults: string[];
}

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv = process.env): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { stdio: ["ignore", "inherit", "pipe"], env });
    let stderr = "";
    child.stderr.on("data", (d: Buffer) => (stderr += d.toString()));
    child.on("error", reject);
    child.on("exit", (code) => (code === 0 ? resolve() : reject(new Error(`${path.basename(cmd)} failed (${code}): ${stderr.trim()}`))));
  });
}

export const objectPath = (key: string) => `objects/${key}`;

export async function backup(opts: BackupOptions): Promise<BackupResult> {
  const log = opts.log ?? console.log;
  await mkdir(path.join(opts.out, "objects"), { recursive: true });
  const client = new pg.Client({ connectionString: opts.databaseUrl });
  await client.connect();
  const faults: string[] = [];
  const entries: { path: string; sha256: string }[] = [];
  let bytes = 0;
  try {
    // One snapshot for the dump and for the list of stored files.
    await client.query("begin isolation level repeatable read read only");
    const snapshot = (await client.query<{ s: string }>("select pg_export_snapshot() as s")).rows[0]!.s;
    const recorded = (await client.query<{ storage_key: string; sha256: string; original_name: string }>("select storage_key, sha256, original_name from stored_file order by uploaded_at, id")).rows;
    const head = (await client.query<{ n: string; h: string | null }>("select count(*)::text as n, (select row_hash from audit_event order by chain_position desc limit 1) as h from audit_event")).rows[0]!;
    const dumpFile = path.join(opts.out, "database.dump");
    log("dumping the database (pg_dump, custom format)");
    await run(path.join(opts.pgBin, "pg_dump"), ["--format=custom", `--snapshot=${snapshot}`, "--file", dumpFile, "--dbname", opts.databaseUrl]);
    await client.query("commit");
    entries.push({ path: "database.dump", sha256: await sha256File(dumpFile) });

    // Every object in the store (orphans of failed uploads included); recorded ones are checked.
    const recordedByKey = new Map(recorded.map((r) => [r.storage_key, r]));
    const keys = new Set([...(await listObjectKeys("")), ...recordedByKey.keys()]);
    log(`copying ${keys.size} stored objects`);
    for (const key of [...keys].sort()) {
      if (key.split("/").includes("..") || key.startsWith("/")) throw new Error(`refusing an object key that would leave the folder: ${key}`);
      const data = await readObjectOrNull(key);
      const record = recordedByKey.get(key);
      if (!data) {
        faults.push(`the stored file “${record?.original_name ?? key}” is recorded but missing from the file store; it is not in the backup.`);
        continue;
      }
      const sha256 = sha256Hex(data);
      if (record && sha256 !== record.sha256) faults.push(`the stored file “${record.original_name}” does not match its recorded SHA-256; copied as found, verify after restoring will name it.`);
      const file = path.join(opts.out, objectPath(key));
      await mkdir(path.dirname(file), { recursive: true });
      await writeFile(file, data);
      entries.push({ path: objectPath(key), sha256 });
      bytes += data.byteLength;
    }
    const about = {
      made: new Date().toISOString(),
      database: new URL(opts.databaseUrl).pathname.slice(1),
      storedFiles: recorded.length,
      objects: entries.length - 1,
      auditRows: Number(head.n),
      auditChainHead: head.h,
      faults,
    };
    await writeFile(path.join(opts.out, "backup.json"), `${JSON.stringify(about, null, 2)}\n`);
    entries.push({ path: "backup.json", sha256: await sha256File(path.join(opts.out, "backup.json")) });
    await writeFile(path.join(opts.out, MANIFEST), formatManifest(entries));
    return { folder: opts.out, files: entries.length, objects: entries.length - 2, bytes, faults };
  } finally {
    await client.end();
  }
}

function argument(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : undefined;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const started = performance.now();
  const databaseUrl = process.env.BACKUP_DATABASE_URL!;
  const out = path.resolve(argument("out") ?? path.join(process.env.BACKUP_ROOT!, new Date().toISOString().replace(/[:.]/g, "-")));
  backup({ databaseUrl, out, pgBin: process.env.PG_BIN! }).then(
    (r) => {
      console.log(`Backup written to ${r.folder}: the database and ${r.objects} stored objects (${(r.bytes / 1024 / 1024).toFixed(1)} MB), ${r.files} files in ${MANIFEST}, ${((performance.now() - started) / 1000).toFixed(1)} s.`);
      for (const f of r.faults) console.log(`Warning: ${f}`);
      process.exit(r.faults.length ? 1 : 0);
    },
    (error: unknown) => {
      console.error("backup failed:", error instanceof Error ? error.message : error);
      process.exit(2);
    },
  );
}
