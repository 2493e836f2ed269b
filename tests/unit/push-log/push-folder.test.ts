import { createHash } from "node:crypto";
import { mkdtemp, readFile, rm, utimes, writeFile } from "node:fs/promises";
import { createServer, type IncomingMessage, type Server, type ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import os from "node:os";
import path from "node:path";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { pushFolder, type PushOptions } from "@/lib/push-log/push-folder";
import { readPushState, writePushState, emptyState } from "@/lib/push-log/push-state";
import { scanFolder, type Sighting } from "@/lib/push-log/complete-files";

const TOKEN = "cwt_" + "k".repeat(43);

/** Stands for the server's part route: keeps parts by SHA-256, answers "already stored" for a repeat. */
class FakeServer {
  parts: { name: string; sha256: string; text: string }[] = [];
  requests: { name: string; auth: string | undefined; cookie: string | undefined; origin: string | undefined }[] = [];
  /** Per request, in turn: what to do instead of answering normally. */
  script: ("lose-answer" | "busy" | "rate-limited" | { refuse: number; message: string })[] = [];
  server!: Server;
  url = "";

  async start() {
    this.server = createServer((req, res) => void this.handle(req, res));
    await new Promise<void>((r) => this.server.listen(0, "127.0.0.1", r));
    this.url = `http://127.0.0.1:${(this.server.address() as AddressInfo).port}`;
  }

  async stop() {
    this.server.closeAllConnections();
    await new Promise((r) => this.server.close(r));
  }

  private async handle(req: IncomingMessage, res: ServerResponse) {
    const url = new URL(req.url!, this.url);
    const chunks: Buffer[] = [];
    for await (const c of req) chunks.push(c as Buffer);
    const body = Buffer.concat(chunks);
    const name = url.searchParams.get("name")!;
    this.requests.push({ name, auth: req.headers.authorization, cookie: req.headers.cookie, origin: req.headers.origin });
    const json = (status: number, value: unknown, headers: Record<string, string> = {}) => {
      res.writeHead(status, { "content-type": "application/json", ...headers });
      res.end(JSON.stringify(value));
    };
    if (url.pathname !== "/api/channel/log-parts" || url.searchParams.get("run") !== "R-00012" || req.headers.authorization !== `Bearer ${TOKEN}`) {
      return json(401, { error: { code: "unauthenticated", message: "This token is not known here." } });
    }
    if (Number(req.headers["content-length"]) !== body.byteLength) return json(422, { error: { code: "invalid", message: "length" } });
    const step = this.script.shift();
    if (step === "busy") return json(503, { error: { code: "unavailable", message: "The database is not answering." } });
    if (step === "rate-limited") return json(429, { error: { code: "rate-limited", message: "Too many requests with this token." } }, { "retry-after": "7" });
    if (typeof step === "object") return json(step.refuse, { error: { code: "invalid", message: step.message } });
    const sha256 = createHash("sha256").update(body).digest("hex");
    const known = this.parts.findIndex((p) => p.sha256 === sha256);
    if (known < 0) this.parts.push({ name, sha256, text: body.toString("utf8") });
    // The part is stored, but the answer never reaches the cycler PC.
    if (step === "lose-answer") return req.socket.destroy();
    const partId = `part-${known < 0 ? this.parts.length : known + 1}`;
    return known < 0 ? json(202, { outcome: "queued", partId, jobId: "job" }) : json(200, { outcome: "already-stored", partId });
  }
}

let dir: string;
let server: FakeServer;
let lines: string[];
let waits: number[];

beforeEach(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), "push-log-"));
  server = new FakeServer();
  await server.start();
  lines = [];
  waits = [];
});

afterEach(async () => {
  await server.stop();
  await rm(dir, { recursive: true, force: true });
});

function options(extra: Partial<PushOptions> = {}): PushOptions {
  return {
    dir,
    url: server.url,
    run: "R-00012",
    token: TOKEN,
    stateFile: path.join(dir, ".cellwright-push-state.json"),
    settleMs: 0,
    intervalMs: 1000,
    once: true,
    log: (l) => lines.push(l),
    sleep: async (ms) => void waits.push(ms),
    backoff: { firstMs: 10, maxMs: 40 },
    ...extra,
  };
}

describe("the push command", () => {
  it("sends finished files in name order with the token only, and remembers them", async () => {
    await writeFile(path.join(dir, "part-10.csv"), "t,v\n10,3.5\n");
    await writeFile(path.join(dir, "part-2.csv"), "t,v\n2,3.6\n");
    await writeFile(path.join(dir, ".hidden"), "x");
    expect(await pushFolder(options())).toEqual({ sent: 2 });
    expect(server.parts.map((p) => p.name)).toEqual(["part-2.csv", "part-10.csv"]);
    expect(server.parts[0]!.text).toBe("t,v\n2,3.6\n");
    expect(server.requests.every((r) => r.cookie === undefined && r.origin === undefined && r.auth === `Bearer ${TOKEN}`)).toBe(true);
    const state = await readPushState(path.join(dir, ".cellwright-push-state.json"), server.url, "R-00012");
    expect(state.sent.map((s) => [s.name, s.sha256])).toEqual([
      ["part-2.csv", createHash("sha256").update("t,v\n2,3.6\n").digest("hex")],
      ["part-10.csv", createHash("sha256").update("t,v\n10,3.5\n").digest("hex")],
    ]);

    // Started again: only the new file goes.
    await writeFile(path.join(dir, "part-11.csv"), "t,v\n11,3.4\n");
    expect(await pushFolder(options())).toEqual({ sent: 1 });
    expect(server.requests.map((r) => r.name)).toEqual(["part-2.csv", "part-10.csv", "part-11.csv"]);
  });

  it("sends again after a lost answer, and the server's 'already stored' keeps the part single", async () => {
    await writeFile(path.join(dir, "part-1.csv"), "t,v\n1,3.6\n");
    server.script = ["lose-answer"];
    expect(await pushFolder(options())).toEqual({ sent: 1 });
    expect(server.parts).toHaveLength(1);
    expect(server.requests).toHaveLength(2);
    expect(lines.some((l) => /^not sent yet: part-1\.csv: the server could not be reached/.test(l))).toBe(true);
    expect(lines).toContain("already on the server: part-1.csv (an earlier answer was lost; not stored twice)");
    expect((await readPushState(path.join(dir, ".cellwright-push-state.json"), server.url, "R-00012")).sent).toHaveLength(1);
  });

  it("resumes after the state file was lost with the server's answer (nothing duplicated)", async () => {
    await writeFile(path.join(dir, "part-1.csv"), "a\n1\n");
    await pushFolder(options());
    await rm(path.join(dir, ".cellwright-push-state.json"));
    await writeFile(path.join(dir, "part-2.csv"), "a\n2\n");
    expect(await pushFolder(options())).toEqual({ sent: 2 });
    expect(server.parts.map((p) => p.name)).toEqual(["part-1.csv", "part-2.csv"]);
  });

  it("waits longer after each failure while the server is down, then carries on", async () => {
    await writeFile(path.join(dir, "part-1.csv"), "a\n1\n");
    const down = { left: 4 };
    const flaky: typeof fetch = async (input, init) => {
      if (down.left-- > 0) throw Object.assign(new TypeError("fetch failed"), { cause: { code: "ECONNREFUSED" } });
      return fetch(input, init);
    };
    server.script = ["busy"];
    expect(await pushFolder(options({ fetcher: flaky }))).toEqual({ sent: 1 });
    expect(waits).toEqual([10, 20, 40, 40, 40]);
    expect(lines[0]).toBe("not sent yet: part-1.csv: the server could not be reached (ECONNREFUSED); trying again in 0 s");
    expect(lines).toContain("not sent yet: part-1.csv: The database is not answering.; trying again in 0 s");
  });

  it("waits as long as the server asks when the token's rate is used up", async () => {
    await writeFile(path.join(dir, "part-1.csv"), "a\n1\n");
    server.script = ["rate-limited"];
    await pushFolder(options());
    expect(waits).toEqual([7000]);
    expect(lines[0]).toBe("not sent yet: part-1.csv: Too many requests with this token.; trying again in 7 s");
  });

  it("stops at a refused part with the server's words, and sends nothing after it", async () => {
    await writeFile(path.join(dir, "part-1.csv"), "a\n1\n");
    await writeFile(path.join(dir, "part-2.csv"), "a\n2\n");
    await writeFile(path.join(dir, "part-3.csv"), "a\n3\n");
    const refuse = { refuse: 422, message: "This part starts before the previous part ends (overlap of 12 s). Nothing was stored." };
    await pushFolder(options());
    expect(server.parts).toHaveLength(3);

    await writeFile(path.join(dir, "part-4.csv"), "a\n4\n");
    await writeFile(path.join(dir, "part-5.csv"), "a\n5\n");
    server.script = [refuse];
    const outcome = await pushFolder(options());
    expect(outcome).toEqual({ sent: 0, refused: { name: "part-4.csv", status: 422, message: refuse.message } });
    expect(server.requests.map((r) => r.name).slice(3)).toEqual(["part-4.csv"]);
    expect(lines).toContain(`refused: part-4.csv: ${refuse.message}`);
  });

  it("refuses a state file kept for another run", async () => {
    const stateFile = path.join(dir, ".cellwright-push-state.json");
    await writePushState(stateFile, emptyState(server.url, "R-00007"));
    await expect(pushFolder(options())).rejects.toThrow("belongs to run R-00007");
    expect(JSON.parse(await readFile(stateFile, "utf8")).run).toBe("R-00007");
  });

  it("holds a file back until it has stopped growing, and the files after it too", async () => {
    await writeFile(path.join(dir, "part-1.csv"), "a\n1\n");
    await writeFile(path.join(dir, "part-2.csv"), "a\n2\n");
    const sightings = new Map<string, Sighting>();
    const at = (s: number) => 1_000_000 + s * 1000;
    const first = await scanFolder(dir, sightings, at(0), 30_000);
    expect(first.map((f) => f.complete)).toEqual([false, false]);
    await writeFile(path.join(dir, "part-2.csv"), "a\n2\n3\n");
    await utimes(path.join(dir, "part-2.csv"), new Date(at(20)), new Date(at(20)));
    const later = await scanFolder(dir, sightings, at(31), 30_000);
    expect(later.map((f) => [f.name, f.complete])).toEqual([
      ["part-1.csv", true],
      ["part-2.csv", false],
    ]);
    await writeFile(path.join(dir, "empty.csv"), "");
    expect((await scanFolder(dir, sightings, at(90), 0)).find((f) => f.name === "empty.csv")?.complete).toBe(false);
  });
});
