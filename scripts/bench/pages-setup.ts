/**
 * Setup of the page benchmark (`npm run bench`): opens one real session per load client for a demo engineer
 * through the app's own session code (lib/auth/session.ts, as signing in does, without argon2 twenty times),
 * makes sure a draft procedure version exists for the editor page, and picks the pages to measure from the
 * seeded demo lab. Prints JSON for scripts/bench/pages.ts. Runs against the bench database only.
 */
import { getDb } from "../../db";
import { closePool } from "../../db/pool";
import { createSession } from "../../lib/auth/session";
import { startNewDraft } from "../../lib/procedures/lifecycle";
import { DEMO_USERS } from "../../scenarios/demo-lab";

const CLIENTS = Number(process.argv[2] ?? 20);

async function main() {
  const db = getDb();
  const demo = DEMO_USERS.find((u) => u.role === "engineer");
  if (!demo) throw new Error("no demo engineer");
  const engineer = await db.selectFrom("app_user").select(["id", "email", "display_name", "role"]).where("email", "=", demo.email).executeTakeFirstOrThrow();
  const actor = { id: engineer.id, email: engineer.email, displayName: engineer.display_name, role: engineer.role };
  const sessions: string[] = [];
  for (let k = 0; k < CLIENTS; k++) sessions.push(await createSession(db, engineer.id, { client: `bench client ${k + 1}` }));

  // The run results page of the demo's certified run (the one the figures were taken on), and of the
  // accepted run with the largest evaluation (most steps and findings).
  const byEvaluationSize = db
    .selectFrom("run_evaluation as e")
    .innerJoin("run as r", "r.id", "e.run_id")
    .select(["r.id", "r.number", "r.specimen_id"])
    .orderBy((eb) => eb.fn("length", [eb.cast("e.evaluation", "text")]), "desc");
  const largest = await byEvaluationSize.where("r.status", "in", ["accepted", "certified"]).executeTakeFirstOrThrow();
  const certified = (await byEvaluationSize.where("r.status", "=", "certified").executeTakeFirst()) ?? largest;

  // The editor needs a draft: take one, or start one from a released version (as an engineer would).
  let draft = await db
    .selectFrom("procedure_version")
    .select(["procedure_id", "number"])
    .where("status", "=", "draft")
    .orderBy("created_at")
    .executeTakeFirst();
  if (!draft) {
    const released = await db.selectFrom("procedure_version").select(["id", "procedure_id"]).where("status", "=", "released").orderBy("created_at").executeTakeFirstOrThrow();
    const made = await startNewDraft(actor, released.id);
    draft = { procedure_id: released.procedure_id, number: made.number };
  }

  console.log(
    JSON.stringify({
      sessions,
      runResults: `/runs/${certified.id}/results`,
      runNumber: certified.number,
      largestRunResults: `/runs/${largest.id}/results`,
      largestRunNumber: largest.number,
      // Its specimen was discharged at several currents: the fullest rate-capability table and overlay.
      rateCapability: `/specimens/${largest.specimen_id}/rate-capability`,
      editor: `/procedures/${draft.procedure_id}/versions/${draft.number}/edit`,
    }),
  );
}

main()
  .then(() => closePool())
  .catch(async (error) => {
    console.error(error);
    await closePool();
    process.exit(1);
  });
