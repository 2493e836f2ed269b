/**
 * Page benchmark (`npm run bench`): the same load against the baseline build and the current build, both
 * served on this machine against one bench database, measured in turns (A, B, B, A, …) so both see the
 * same background load. Reports numbers, asserts nothing.
 *
 *   load:   autocannon, 20 connections, each carrying its own signed-in session, closed loop (a client sends
 *           its next request when the last answer arrived), for the run results page, GET /api/runs and the
 *           certificate list. Latency percentiles are computed from every response time, not autocannon's
 *           histogram buckets (which have no p95).
 *   alone:  one client, one page at a time: the server's answer (full HTML, fetch) and the page settled in
 *           Chromium (navigation start to the later of the load event and the last network response).
 *
 * Input: the JSON written by pages-setup.ts (argv[2]) and BENCH_NOW_URL, optionally BENCH_BASELINE_URL.
 */
import { readFileSync } from "node:fs";
import { loadavg } from "node:os";
import { performance } from "node:perf_hooks";
import autocannon from "autocannon";
import { chromium } from "@playwright/test";

interface Targets {
  sessions: string[];
  runResults: string;
  runNumber: string;
  largestRunResults: string;
  largestRunNumber: string;
  rateCapability: string;
  editor: string;
}

const targets = JSON.parse(readFileSync(process.argv[2] as string, "utf8")) as Targets;
const servers = [
  ...(process.env.BENCH_BASELINE_URL ? [{ name: "baseline", url: process.env.BENCH_BASELINE_URL }] : []),
  { name: "now", url: process.env.BENCH_NOW_URL as string },
];
const LOAD_SECONDS = Number(process.env.BENCH_LOAD_SECONDS ?? 20);
const LOAD_TURNS = Number(process.env.BENCH_LOAD_TURNS ?? 2);
const ALONE_RUNS = Number(process.env.BENCH_ALONE_RUNS ?? 10);
const CLIENTS = targets.sessions.length;
const COOKIE = "cellwright_session";

const load = () => loadavg().map((x) => x.toFixed(1)).join(" ");
const quantile = (xs: number[], q: number) => {
  if (xs.length === 0) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil(q * s.length) - 1)] as number;
};

/** Per server and measured thing: every latency, requests, seconds, bytes, non-2xx answers. */
type Tally = { latencies: number[]; requests: number; seconds: number; bytes: number; errors: number; loads: number[] };
const tallies = new Map<string, Tally>();
const tally = (server: string, what: string): Tally => {
  const key = `${server}\u0000${what}`;
  let t = tallies.get(key);
  if (!t) tallies.set(key, (t = { latencies: [], requests: 0, seconds: 0, bytes: 0, errors: 0, loads: [] }));
  return t;
};

async function fetchPage(base: string, path: string, session: string): Promise<{ ms: number; bytes: number; status: number }> {
  const t = performance.now();
  const res = await fetch(base + path, { headers: { cookie: `${COOKIE}=${session}` }, redirect: "manual" });
  const body = await res.arrayBuffer();
  return { ms: performance.now() - t, bytes: body.byteLength, status: res.status };
}

/** The compare page as a reviewer reaches it: the rate-capability page's "Overlay its discharges" link. */
async function findComparePath(base: string): Promise<string> {
  const res = await fetch(base + targets.rateCapability, { headers: { cookie: `${COOKIE}=${targets.sessions[0]}` } });
  const html = await res.text();
  const href = /href="(\/compare\?[^"]+)"/.exec(html)?.[1];
  return href ? href.replaceAll("&amp;", "&") : "/compare";
}

function runLoad(base: string, path: string, server: string, what: string): Promise<void> {
  const t = tally(server, what);
  t.loads.push(loadavg()[0] as number);
  let next = 0;
  return new Promise((resolve, reject) => {
    const instance = autocannon(
      {
        url: base + path,
        connections: CLIENTS,
        duration: LOAD_SECONDS,
        // Each connection signs its requests with its own session: twenty signed-in clients, not one.
        requests: [
          {
            setupRequest: (req, context) => {
              const client = context as { session?: string };
              client.session ??= targets.sessions[next++ % CLIENTS];
              return { ...req, headers: { ...req.headers, cookie: `${COOKIE}=${client.session}` } };
            },
          },
        ],
      },
      (error, result) => {
        if (error) return reject(error);
        t.requests += result.requests.total;
        t.seconds += result.duration;
        t.errors += result.non2xx + result.errors + result.timeouts;
        resolve();
      },
    );
    instance.on("response", (_client: unknown, _status: number, bytes: number, ms: number) => {
      t.latencies.push(ms);
      t.bytes += bytes;
    });
  });
}

async function settleInBrowser(browser: import("@playwright/test").Browser, base: string, path: string): Promise<number> {
  const context = await browser.newContext();
  await context.addCookies([{ name: COOKIE, value: targets.sessions[0] as string, url: base, httpOnly: true, sameSite: "Lax" }]);
  const page = await context.newPage();
  try {
    await page.goto(base + path, { waitUntil: "networkidle", timeout: 60_000 });
    // Settled: the later of the load event and the last response the page waited on (data, chunks, images).
    return await page.evaluate(() => {
      const nav = window.performance.getEntriesByType("navigation")[0] as PerformanceNavigationTiming;
      const last = window.performance.getEntriesByType("resource").reduce((m, r) => Math.max(m, (r as PerformanceResourceTiming).responseEnd), 0);
      return Math.max(nav.loadEventEnd, last);
    });
  } finally {
    await context.close();
  }
}

async function main() {
  const comparePath = await findComparePath(servers[servers.length - 1]!.url);
  const alone = [
    { what: "run results page", path: targets.runResults },
    { what: `run results page, largest evaluation (${targets.largestRunNumber})`, path: targets.largestRunResults },
    { what: "compare page", path: comparePath },
    { what: "procedure editor", path: targets.editor },
    { what: "rate-capability page", path: targets.rateCapability },
  ];
  const loaded = [
    { what: "run results page", path: targets.runResults },
    { what: "run list API", path: "/api/runs" },
    { what: "certificate list", path: "/certificates" },
  ];
  console.log(`pages: ${servers.map((s) => `${s.name} ${s.url}`).join(", ")}; ${CLIENTS} clients; run ${targets.runNumber} (certified); load average ${load()}`);

  // Warm each server (first requests compile routes and fill caches), then check every page answers 200.
  for (const s of servers) {
    for (const p of [...alone, ...loaded]) {
      for (let k = 0; k < 3; k++) {
        const r = await fetchPage(s.url, p.path, targets.sessions[0] as string);
        if (r.status !== 200) throw new Error(`${s.name} ${p.path} answered ${r.status}`);
      }
    }
  }

  // One client: the server's answer, in turns.
  for (let k = 0; k < ALONE_RUNS; k++) {
    const order = k % 2 === 0 ? servers : [...servers].reverse();
    for (const s of order) {
      for (const p of alone) {
        const r = await fetchPage(s.url, p.path, targets.sessions[1] as string);
        const t = tally(s.name, `alone server ${p.what}`);
        t.latencies.push(r.ms);
        t.bytes = r.bytes;
      }
    }
  }
  // One client in Chromium: the page settled.
  const browser = await chromium.launch({
    executablePath: "/usr/bin/chromium",
    args: ["--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
  try {
    for (let k = 0; k < ALONE_RUNS; k++) {
      const order = k % 2 === 0 ? servers : [...servers].reverse();
      for (const s of order) {
        for (const p of alone) tally(s.name, `alone browser ${p.what}`).latencies.push(await settleInBrowser(browser, s.url, p.path));
      }
    }
  } finally {
    await browser.close();
  }
  console.log(`  single-client timings done; load average ${load()}`);

  // Twenty clients, in turns: A B, then B A, so neither always runs second.
  for (let turn = 0; turn < LOAD_TURNS; turn++) {
    const order = turn % 2 === 0 ? servers : [...servers].reverse();
    for (const p of loaded) {
      for (const s of order) {
        await runLoad(s.url, p.path, s.name, `load ${p.what}`);
        console.log(`  ${s.name.padEnd(8)} ${p.what}: ${LOAD_SECONDS} s, load average ${load()}`);
      }
    }
  }

  printTable(alone, loaded);
}

function printTable(alone: { what: string }[], loaded: { what: string }[]) {
  const f = (x: number) => (Number.isNaN(x) ? "–" : x >= 100 ? x.toFixed(0) : x.toFixed(1));
  const cell = (server: string, key: string, kind: "alone-server" | "alone-browser" | "load") => {
    const t = tallies.get(`${server}\u0000${key}`);
    if (!t || t.latencies.length === 0) return "–";
    if (kind === "load") {
      const rate = t.requests / t.seconds;
      return `p50 ${f(quantile(t.latencies, 0.5))} / p95 ${f(quantile(t.latencies, 0.95))} / p99 ${f(quantile(t.latencies, 0.99))} ms; ${rate.toFixed(1)} req/s${t.errors ? `; ${t.errors} not 2xx` : ""}`;
    }
    const size = kind === "alone-server" ? `, ${(t.bytes / 1024).toFixed(0)} kB` : "";
    return `p50 ${f(quantile(t.latencies, 0.5))} / p95 ${f(quantile(t.latencies, 0.95))} ms${size}`;
  };
  const target: Record<string, string> = {
    "alone server run results page": "keep",
    "load run results page": "page p95 ≤ 200 ms",
    "load run list API": "(≈ 3× throughput together)",
    "load certificate list": "–",
    "alone browser compare page": "p95 ≤ 1000 ms",
    "alone browser procedure editor": "p95 ≤ 1000 ms",
    "alone browser rate-capability page": "p95 ≤ 1000 ms",
  };
  const rows: [string, string][] = [];
  for (const p of alone) rows.push([`${p.what}, 1 client, server answer`, `alone server ${p.what}`]);
  for (const p of alone) rows.push([`${p.what}, 1 client, settled in Chromium`, `alone browser ${p.what}`]);
  for (const p of loaded) rows.push([`${p.what}, ${CLIENTS} clients × ${LOAD_SECONDS} s × ${LOAD_TURNS} turns`, `load ${p.what}`]);
  const names = servers.map((s) => s.name);
  const header = ["what", ...names, "target"];
  console.log("");
  console.log(`| ${header.join(" | ")} |`);
  console.log(`| ${header.map(() => "---").join(" | ")} |`);
  for (const [label, key] of rows) {
    const kind = key.startsWith("load") ? "load" : key.startsWith("alone server") ? "alone-server" : "alone-browser";
    console.log(`| ${label} | ${names.map((n) => cell(n, key, kind)).join(" | ")} | ${target[key] ?? "–"} |`);
  }
  for (const n of names) {
    const together = loaded.slice(0, 2).reduce((sum, p) => {
      const t = tallies.get(`${n}\u0000load ${p.what}`);
      return sum + (t ? t.requests / t.seconds : 0);
    }, 0);
    console.log(`${n}: run results page + run list API ≈ ${together.toFixed(1)} req/s (each measured on its own)`);
  }
  const loads = [...tallies.values()].flatMap((t) => t.loads);
  console.log(
    `Measured under the machine's background load (1-minute load average during the load runs ${f(Math.min(...loads))}–${f(Math.max(...loads))}, now ${load()}, on ${process.env.BENCH_CORES ?? "2"} cores): figures, not a verdict; the targets hold only where the table shows them.`,
  );
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
