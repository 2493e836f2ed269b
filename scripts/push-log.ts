// `npm run push-log -- --watch DIR --url URL --run R-00012 --token-file FILE`: runs on the cycler PC and
// pushes each finished log file in DIR to the run, in order (docs/push-log.md). It only reads the folder
// and sends; it never writes to the cycler's files and never talks to the cycler.
import { readFile, stat } from "node:fs/promises";
import path from "node:path";
import { parseArgs } from "node:util";
import { pushFolder } from "../lib/push-log/push-folder";
import { looksLikeToken } from "../lib/machine-tokens/token-secret";

const USAGE = `Usage: npm run push-log -- --watch DIR --url URL --run R-00012 --token-file FILE
  --watch DIR         the folder the cycler writes its log files to
  --url URL           the Cellwright address, e.g. https://cellwright.lab.example
  --run R-00012       the run the files belong to
  --token-file FILE   a file holding the channel's token (or set CELLWRIGHT_TOKEN instead)
  --state FILE        where to remember what was sent (default: DIR/.cellwright-push-state.json)
  --settle SECONDS    a file counts as finished once unchanged this long (default 30)
  --interval SECONDS  how often to look at the folder (default 10)
  --once              send what is finished now, then stop`;

function fail(message: string): never {
  console.error(`push-log: ${message}\n\n${USAGE}`);
  process.exit(1);
}

async function main() {
  if (process.argv.slice(2).some((a) => a === "--token" || a.startsWith("--token="))) {
    fail("never give the token on the command line (it would stay in the shell's history); use --token-file or CELLWRIGHT_TOKEN.");
  }
  let args;
  try {
    args = parseArgs({
      options: {
        watch: { type: "string" },
        url: { type: "string" },
        run: { type: "string" },
        "token-file": { type: "string" },
        state: { type: "string" },
        settle: { type: "string", default: "30" },
        interval: { type: "string", default: "10" },
        once: { type: "boolean", default: false },
        help: { type: "boolean", default: false },
      },
    }).values;
  } catch (error) {
    fail((error as Error).message);
  }
  if (args.help) {
    console.log(USAGE);
    return;
  }
  if (!args.watch) fail("say which folder to watch (--watch DIR).");
  if (!args.url || !/^https?:\/\//.test(args.url)) fail("give the Cellwright address, starting with https:// (--url).");
  if (!args.run || !/^R-\d{5,}$/.test(args.run)) fail("give the run number as it appears on the run page, e.g. R-00012 (--run).");
  const token = (args["token-file"] ? await readFile(args["token-file"], "utf8").catch(() => fail(`cannot read the token file ${args["token-file"]}.`)) : process.env.CELLWRIGHT_TOKEN ?? "").trim();
  if (!token) fail("give the token in a file (--token-file FILE) or in CELLWRIGHT_TOKEN.");
  if (!looksLikeToken(token)) fail("the token does not look like one Cellwright issued (it starts with cwt_ and has 47 characters). Copy it again.");
  const settle = Number(args.settle);
  const interval = Number(args.interval);
  if (!(settle >= 0) || !(interval > 0)) fail("--settle and --interval are numbers of seconds.");

  const dir = path.resolve(args.watch);
  if (!(await stat(dir).then((s) => s.isDirectory()).catch(() => false))) fail(`the folder ${dir} does not exist or is not a folder.`);
  const stateFile = path.resolve(args.state ?? path.join(dir, ".cellwright-push-state.json"));
  const stop = new AbortController();
  process.once("SIGINT", () => stop.abort());
  process.once("SIGTERM", () => stop.abort());
  const log = (line: string) => console.log(`${new Date().toISOString().slice(0, 19).replace("T", " ")} ${line}`);
  log(`watching ${dir} for run ${args.run} on ${args.url}${args.once ? " (once)" : ""}; remembering what was sent in ${stateFile}`);
  const outcome = await pushFolder({
    dir,
    url: args.url,
    run: args.run,
    token,
    stateFile,
    settleMs: settle * 1000,
    intervalMs: interval * 1000,
    once: args.once,
    log,
    signal: stop.signal,
  });
  log(`${outcome.sent} ${outcome.sent === 1 ? "part" : "parts"} sent${stop.signal.aborted ? "; stopped on request" : ""}.`);
  if (outcome.refused) process.exit(2);
}

main().catch((error: unknown) => {
  console.error(`push-log: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
});
