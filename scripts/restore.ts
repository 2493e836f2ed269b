// `npm run restore -- <folder> [--profile demo|test] [--database NAME] [--replace]`: checks a backup
// folder against its manifest first (one changed byte refuses the whole restore, naming the file), then
// builds a fresh database from the dump and puts every stored object back into the object store.
import { spawn } from "node:child_process";
import { readFile } from "node:fs/promises";
import path from "node:path";
import pg from "pg";
import { putObject } from "../lib/storage";
import { checkBackupFolder, MANIFEST } from "./backup-manifest";

export class RestoreRefused extends Error {
  constructor(readonly problems: string[]) {
    super(`the backup is not restored:\n  ${problems.join("\n  ")}`);
    this.name = "RestoreRefused";
  }
}

export interface RestoreOptions {
  folder: string;
  /** Superuser URL of the cluster's maintenance database (postgres). */
  adminUrl: string;
  database: string;
  /** Drop the database first if it exists; otherwise an existing database refuses the restore. */
  replace?: boolean;
  pgBin: string;
  log?: (line: string) => void;
}

function run(cmd: string, args: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { stdio: ["ignore", "inherit", "pipe"] });
    let stderr = "";
    child.stderr.on("data", (d: Buffer) => (stderr += d.toString()));
    child.on("error", reject);
    child.on("exit", (code) => (code === 0 ? resolve() : reject(new Error(`${path.basename(cmd)} failed (${code}): ${stderr.trim()}`))));
  });
}

const databaseUrl = (adminUrl: string, database: string) => {
  const url = new URL(adminUrl);
  url.pathname = `/${database}`;
  return url.toString();
};

export async function restore(opts: RestoreOptions): Promise<{ database: string; objects: number }> {
  const log = opts.log ?? console.log;
  if (!/^[a-z_][a-z0-9_]*$/.test(opts.database)) throw new RestoreRefused([`“${opts.database}” is not a plain database name.`]);
  log(`checking ${opts.folder} against its ${MANIFEST}`);
  const problems = await checkBackupFolder(opts.folder);
  if (problems.length) throw new RestoreRefused(problems);

  const admin = new pg.Client({ connectionString: opts.adminUrl });
  await admin.connect();
  try {
    const exists = (await admin.query("select 1 from pg_database where datname = $1", [opts.database])).rowCount;
    if (exists && !opts.replace) throw new RestoreRefused([`The database ${opts.database} exists: pass --replace to drop it first, or --database <new name> to restore beside it.`]);
    if (exists) await admin.query(`drop database ${opts.database} with (force)`);
    await admin.query(`create database ${opts.database}`);
  } finally {
    await admin.end();
  }
  const target = databaseUrl(opts.adminUrl, opts.database);
  log(`restoring the database ${opts.database} (pg_restore)`);
  await run(path.join(opts.pgBin, "pg_restore"), ["--exit-on-error", "--dbname", target, path.join(opts.folder, "database.dump")]);

  const client = new pg.Client({ connectionString: target });
  await client.connect();
  let contentTypes: Map<string, string>;
  try {
    contentTypes = new Map((await client.query<{ storage_key: string; content_type: string }>("select storage_key, content_type from stored_file")).rows.map((r) => [r.storage_key, r.content_type]));
  } finally {
    await client.end();
  }
  const manifest = await readFile(path.join(opts.folder, MANIFEST), "utf8");
  const objects = manifest
    .split("\n")
    .map((line) => line.slice(66))
    .filter((p) => p.startsWith("objects/"));
  log(`putting ${objects.length} stored objects back`);
  for (const p of objects) {
    const key = p.slice("objects/".length);
    await putObject(key, await readFile(path.join(opts.folder, p)), contentTypes.get(key) ?? "application/octet-stream");
  }
  return { database: opts.database, objects: objects.length };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const args = process.argv.slice(2);
  const option = (name: string) => {
    const i = args.indexOf(`--${name}`);
    return i >= 0 ? args[i + 1] : undefined;
  };
  const folder = args.find((a, i) => !a.startsWith("--") && !["--database", "--profile"].includes(args[i - 1] ?? ""));
  if (!folder) {
    console.error("usage: npm run restore -- <backup folder> [--profile demo|test] [--database NAME] [--replace]");
    process.exit(2);
  }
  const started = performance.now();
  restore({
    folder: path.resolve(folder),
    adminUrl: process.env.RESTORE_ADMIN_URL!,
    database: option("database") ?? process.env.PG_DB!,
    replace: args.includes("--replace"),
    pgBin: process.env.PG_BIN!,
  }).then(
    (r) => {
      console.log(`Restored ${r.database} and ${r.objects} stored objects in ${((performance.now() - started) / 1000).toFixed(1)} s.`);
      process.exit(0);
    },
    (error: unknown) => {
      console.error(error instanceof RestoreRefused ? `Refused: ${error.message}` : `restore failed: ${error instanceof Error ? error.message : String(error)}`);
      process.exit(error instanceof RestoreRefused ? 1 : 2);
    },
  );
}
