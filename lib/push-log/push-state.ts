import { mkdir, readFile, rename, writeFile } from "node:fs/promises";
import path from "node:path";
import { z } from "zod";

/**
 * What the push command remembers between starts: the SHA-256 of every part the server has confirmed,
 * for one run and one server. A part whose answer was lost is sent again; the server recognises its
 * hash and answers "already stored", so nothing is duplicated either way.
 */
const stateSchema = z.object({
  format: z.literal(1),
  url: z.string(),
  run: z.string(),
  sent: z.array(z.object({ name: z.string(), sha256: z.string(), sizeBytes: z.number(), partId: z.string(), at: z.string() })),
});
export type PushState = z.infer<typeof stateSchema>;

export function emptyState(url: string, run: string): PushState {
  return { format: 1, url, run, sent: [] };
}

/** The state file, or a fresh state when there is none; a state kept for another run or server is refused. */
export async function readPushState(file: string, url: string, run: string): Promise<PushState> {
  let text: string;
  try {
    text = await readFile(file, "utf8");
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === "ENOENT") return emptyState(url, run);
    throw error;
  }
  const parsed = stateSchema.safeParse(JSON.parse(text));
  if (!parsed.success) throw new Error(`The state file ${file} is not one this command wrote. Move it away to start again.`);
  if (parsed.data.run !== run || parsed.data.url !== url) {
    throw new Error(`The state file ${file} belongs to run ${parsed.data.run} on ${parsed.data.url}. Give each run its own folder or --state file.`);
  }
  return parsed.data;
}

/** Written to a temporary file and renamed over the old one, so a power cut never leaves half a state. */
export async function writePushState(file: string, state: PushState): Promise<void> {
  await mkdir(path.dirname(file), { recursive: true });
  const temporary = `${file}.${process.pid}.tmp`;
  await writeFile(temporary, `${JSON.stringify(state, null, 2)}\n`, "utf8");
  await rename(temporary, file);
}

export function alreadySent(state: PushState, sha256: string): boolean {
  return state.sent.some((s) => s.sha256 === sha256);
}
