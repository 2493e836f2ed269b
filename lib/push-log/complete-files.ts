import { readdir, stat } from "node:fs/promises";
import path from "node:path";

/** How a file looked at the last scan, and since when it has looked so. */
export interface Sighting {
  size: number;
  mtimeMs: number;
  since: number;
}

/** File names as people number them: "part-2" before "part-10". */
export const compareNames = (a: string, b: string) => a.localeCompare(b, "en", { numeric: true });

/**
 * The files of the folder a cycler writes to, in name order, each marked complete once it is not empty and
 * its size and modification time have not changed for `settleMs` (the cycler has stopped writing it).
 * Hidden files, the command's own state file and sub-folders are left alone. `sightings` carries what the
 * previous scan saw.
 */
export async function scanFolder(
  dir: string,
  sightings: Map<string, Sighting>,
  now: number,
  settleMs: number,
  ignore: ReadonlySet<string> = new Set(),
): Promise<{ name: string; file: string; size: number; complete: boolean }[]> {
  const found: { name: string; file: string; size: number; complete: boolean }[] = [];
  for (const entry of await readdir(dir, { withFileTypes: true })) {
    if (!entry.isFile() || entry.name.startsWith(".") || entry.name.endsWith(".tmp") || ignore.has(entry.name)) continue;
    const file = path.join(dir, entry.name);
    const s = await stat(file);
    const before = sightings.get(entry.name);
    const unchanged = before !== undefined && before.size === s.size && before.mtimeMs === s.mtimeMs;
    const since = unchanged ? before.since : now;
    sightings.set(entry.name, { size: s.size, mtimeMs: s.mtimeMs, since });
    found.push({ name: entry.name, file, size: s.size, complete: s.size > 0 && (settleMs === 0 || (unchanged && now - since >= settleMs)) });
  }
  return found.sort((a, b) => compareNames(a.name, b.name));
}
