// The manifest of a backup folder: SHA256SUMS in the format `sha256sum -c` reads ("<hex>  <path>").
import { createHash } from "node:crypto";
import { createReadStream } from "node:fs";
import { readdir, readFile } from "node:fs/promises";
import path from "node:path";

export const MANIFEST = "SHA256SUMS";

export async function sha256File(file: string): Promise<string> {
  const hash = createHash("sha256");
  for await (const chunk of createReadStream(file)) hash.update(chunk as Buffer);
  return hash.digest("hex");
}

export function formatManifest(entries: { path: string; sha256: string }[]): string {
  return entries.map((e) => `${e.sha256}  ${e.path}\n`).join("");
}

async function listFiles(dir: string, base = dir): Promise<string[]> {
  const out: string[] = [];
  for (const entry of await readdir(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) out.push(...(await listFiles(full, base)));
    else out.push(path.relative(base, full).split(path.sep).join("/"));
  }
  return out;
}

/**
 * Checks every file a backup folder's manifest lists against its hash, and that the folder holds no file
 * the manifest does not list. Returns the problems in plain words, each naming the file; empty when intact.
 */
export async function checkBackupFolder(folder: string): Promise<string[]> {
  let text: string;
  try {
    text = await readFile(path.join(folder, MANIFEST), "utf8");
  } catch {
    return [`${folder} has no ${MANIFEST}: it is not a Cellwright backup folder, or the manifest was removed.`];
  }
  const problems: string[] = [];
  const listed = new Map<string, string>();
  for (const [i, line] of text.split("\n").entries()) {
    if (!line) continue;
    const m = /^([0-9a-f]{64}) {2}(.+)$/.exec(line);
    if (!m || m[2]!.split("/").includes("..") || path.isAbsolute(m[2]!)) {
      problems.push(`${MANIFEST} line ${i + 1} is not "<SHA-256>  <file>".`);
      continue;
    }
    listed.set(m[2]!, m[1]!);
  }
  for (const [file, expected] of listed) {
    let found: string;
    try {
      found = await sha256File(path.join(folder, file));
    } catch {
      problems.push(`${file} is listed in the manifest but missing from the folder.`);
      continue;
    }
    if (found !== expected) problems.push(`${file} has been changed since the backup was made: its SHA-256 is ${found}, the manifest says ${expected}.`);
  }
  for (const file of await listFiles(folder)) {
    if (file !== MANIFEST && !listed.has(file)) problems.push(`${file} is in the folder but not in the manifest.`);
  }
  return problems;
}
