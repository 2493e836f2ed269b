import { createHash } from "node:crypto";
import { readFile } from "node:fs/promises";
import path from "node:path";
import { scanFolder, type Sighting } from "./complete-files";
import { alreadySent, readPushState, writePushState } from "./push-state";
import { sendPart } from "./send-part";

export interface PushOptions {
  dir: string;
  /** The Cellwright address, e.g. https://cellwright.lab.example */
  url: string;
  run: string;
  token: string;
  stateFile: string;
  /** A file counts as finished once unchanged this long (0: at once). */
  settleMs: number;
  /** How often the folder is looked at. */
  intervalMs: number;
  /** One look at the folder, every finished file sent, then stop. */
  once: boolean;
  log: (line: string) => void;
  fetcher?: typeof fetch;
  sleep?: (ms: number) => Promise<void>;
  now?: () => number;
  /** Waits after a failed attempt: the first, doubled each time up to the last. */
  backoff?: { firstMs: number; maxMs: number };
  signal?: AbortSignal;
}

export interface PushOutcome {
  sent: number;
  /** Set when the server refused a part: the command stops, since later parts must follow it in order. */
  refused?: { name: string; status: number; message: string };
}

const defaultSleep = (ms: number, signal?: AbortSignal) =>
  new Promise<void>((resolve) => {
    const t = setTimeout(resolve, ms);
    signal?.addEventListener("abort", () => (clearTimeout(t), resolve()), { once: true });
  });

const kB = (n: number) => (n < 1024 * 1024 ? `${(n / 1024).toFixed(1)} kB` : `${(n / 1048576).toFixed(1)} MB`);

/**
 * Watches the folder and pushes each finished file, in name order, as one part of the run's log. A file
 * still being written holds back the ones after it. A network failure or a busy server is retried with a
 * growing wait; a refusal stops the command with the server's words. What the server confirmed is kept in
 * the state file, so a restart sends only what is new, and a part whose answer was lost is recognised by
 * the server ("already stored").
 */
export async function pushFolder(o: PushOptions): Promise<PushOutcome> {
  const sleep = o.sleep ?? ((ms: number) => defaultSleep(ms, o.signal));
  const now = o.now ?? Date.now;
  const backoff = o.backoff ?? { firstMs: 5_000, maxMs: 300_000 };
  const state = await readPushState(o.stateFile, o.url, o.run);
  const sightings = new Map<string, Sighting>();
  const ignore = new Set([path.basename(o.stateFile)]);
  const warned = new Set<string>();
  let sent = 0;
  let waitingFor: string | null = null;

  while (!o.signal?.aborted) {
    let files: Awaited<ReturnType<typeof scanFolder>>;
    try {
      files = await scanFolder(o.dir, sightings, now(), o.settleMs, ignore);
    } catch (error) {
      // A network share that went away, a folder being moved: look again later, unless asked for one look.
      if (o.once) throw error;
      o.log(`cannot read the folder ${o.dir} (${(error as NodeJS.ErrnoException).code ?? String(error)}); looking again in ${Math.round(o.intervalMs / 1000)} s`);
      await sleep(o.intervalMs);
      continue;
    }
    for (const f of files) {
      if (o.signal?.aborted) break;
      if (!f.complete) {
        if (waitingFor !== f.name) o.log(f.size === 0 ? `waiting: ${f.name} is still empty` : `waiting: ${f.name} is still being written`);
        waitingFor = f.name;
        break;
      }
      const bytes = await readFile(f.file);
      const sha256 = createHash("sha256").update(bytes).digest("hex");
      if (alreadySent(state, sha256)) continue;
      if (state.sent.some((s) => s.name === f.name)) {
        if (!warned.has(f.name)) o.log(`not sent: ${f.name} changed after it was sent; a sent part is never sent again. Save new data as a new file.`);
        warned.add(f.name);
        continue;
      }
      let wait = backoff.firstMs;
      for (;;) {
        const answer = await sendPart({ base: o.url, run: o.run, token: o.token, name: f.name, bytes }, o.fetcher);
        if (answer.kind === "stored") {
          state.sent.push({ name: f.name, sha256, sizeBytes: bytes.byteLength, partId: answer.partId, at: new Date(now()).toISOString() });
          await writePushState(o.stateFile, state);
          sent += 1;
          o.log(answer.alreadyStored ? `already on the server: ${f.name} (an earlier answer was lost; not stored twice)` : `sent: ${f.name} (${kB(bytes.byteLength)}) to run ${o.run}`);
          break;
        }
        if (answer.kind === "refused") {
          o.log(`refused: ${f.name}: ${answer.message}`);
          o.log("stopped: later files are not sent before this one. Fix the cause, then start the command again.");
          return { sent, refused: { name: f.name, status: answer.status, message: answer.message } };
        }
        const ms = answer.waitMs ?? wait;
        o.log(`not sent yet: ${f.name}: ${answer.message}; trying again in ${Math.round(ms / 1000)} s`);
        await sleep(ms);
        if (o.signal?.aborted) return { sent };
        wait = Math.min(wait * 2, backoff.maxMs);
      }
    }
    if (o.once) break;
    await sleep(o.intervalMs);
  }
  return { sent };
}
