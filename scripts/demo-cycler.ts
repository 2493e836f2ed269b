// `npm run demo` only: an invented cycler for the demo's live endurance run (DEMO_LIVE_ENDURANCE_RUN). Every
// DEMO_CYCLER_EVERY_S seconds (45 by default) it writes the next few cycles of the run's invented log into
// a folder as one CSV file, as a cycler that exports its log in files does; the push command watches that
// folder and sends each file to the run. It writes files and nothing else: no cycler, no cell, no network.
import { readdir, rename, writeFile } from "node:fs/promises";
import path from "node:path";
import { DEMO_LIVE_ENDURANCE_RUN } from "../scenarios/demo-lab";
import { enduranceLogPlan, formatEnduranceLogPart } from "../scenarios/endurance-log";

const folder = process.argv[2];
if (!folder) {
  console.error("usage: tsx scripts/demo-cycler.ts FOLDER");
  process.exit(1);
}
const everyMs = Number(process.env.DEMO_CYCLER_EVERY_S ?? 45) * 1000;
const scenario = DEMO_LIVE_ENDURANCE_RUN;
const plan = { ...enduranceLogPlan, ...scenario.plan };
const prefix = `${scenario.specimen.toLowerCase()}-${scenario.channel.toLowerCase()}-cycles-`;
const pad = (n: number) => String(n).padStart(4, "0");

/** The last cycle already written to the folder (a demo started again goes on where it stopped). */
async function lastWrittenCycle(): Promise<number> {
  let last = scenario.seededCycles;
  for (const name of await readdir(folder!)) {
    const m = new RegExp(`^${prefix}(\\d{4})-(\\d{4})\\.csv$`).exec(name);
    if (m) last = Math.max(last, Number(m[2]));
  }
  return last;
}

const stamp = () => new Date().toISOString().slice(0, 19).replace("T", " ");

async function writeNext(): Promise<boolean> {
  const from = (await lastWrittenCycle()) + 1;
  if (from > plan.cycles) {
    console.log(`${stamp()} demo cycler: all ${plan.cycles} cycles written; nothing more to do`);
    return false;
  }
  const to = Math.min(plan.cycles, from + scenario.cyclesPerPart - 1);
  const name = `${prefix}${pad(from)}-${pad(to)}.csv`;
  // Written under a name the push command skips, then renamed: it never sees half a file.
  const temporary = path.join(folder!, `${name}.tmp`);
  await writeFile(temporary, formatEnduranceLogPart(plan, from, to));
  await rename(temporary, path.join(folder!, name));
  console.log(`${stamp()} demo cycler: wrote ${name} (cycles ${from} to ${to} of the invented log)`);
  return true;
}

async function main() {
  console.log(`${stamp()} demo cycler: writing run ${scenario.specimen}'s next cycles into ${folder} every ${everyMs / 1000} s`);
  while (await writeNext()) await new Promise((r) => setTimeout(r, everyMs));
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
