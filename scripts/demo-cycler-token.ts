// `npm run demo` only: the token the demo's push command uses for the live endurance run's cycler channel.
// Issued once (as the demo administrator, audited like any token) and kept in a mode-600 file of the demo's
// state folder; issued again when the file is missing or its token expired or was revoked. Prints the run
// to open, never the token.
import { chmod, mkdir, readFile, writeFile } from "node:fs/promises";
import path from "node:path";
import { getDb } from "../db";
import type { SignedInUser } from "../lib/auth/signed-in-user";
import { hashTokenSecret } from "../lib/machine-tokens/token-secret";
import { issueMachineToken } from "../lib/machine-tokens/token-admin";
import { DEMO_LIVE_ENDURANCE_RUN } from "../scenarios/demo-lab";

async function main() {
  const file = process.argv[2];
  if (!file) throw new Error("usage: demo-cycler-token.ts TOKEN_FILE");
  const db = getDb();
  const run = await db
    .selectFrom("run")
    .innerJoin("specimen", "specimen.id", "run.specimen_id")
    .select(["run.id", "run.number"])
    .where("specimen.identifier", "=", DEMO_LIVE_ENDURANCE_RUN.specimen)
    .executeTakeFirstOrThrow();
  const channel = await db.selectFrom("instrument").select("id").where("identifier", "=", DEMO_LIVE_ENDURANCE_RUN.channel).executeTakeFirstOrThrow();
  const kept = await readFile(file, "utf8").then((t) => t.trim(), () => null);
  const usable =
    kept !== null &&
    (await db
      .selectFrom("machine_token")
      .select("id")
      .where("secret_sha256", "=", hashTokenSecret(kept))
      .where("instrument_id", "=", channel.id)
      .where("revoked_at", "is", null)
      .where("expires_at", ">", new Date())
      .executeTakeFirst()) !== undefined;
  if (!usable) {
    const a = await db.selectFrom("app_user").select(["id", "email", "display_name", "role"]).where("role", "=", "admin").orderBy("created_at").executeTakeFirstOrThrow();
    const admin: SignedInUser = { id: a.id, email: a.email, displayName: a.display_name, role: a.role };
    const issued = await issueMachineToken(admin, { instrumentId: channel.id, label: DEMO_LIVE_ENDURANCE_RUN.tokenLabel, days: 30 });
    await mkdir(path.dirname(file), { recursive: true, mode: 0o700 });
    await writeFile(file, `${issued.token}\n`, { mode: 0o600 });
    await chmod(file, 0o600);
  }
  // demo.sh reads these two words: the run's number and id.
  console.log(`${run.number} ${run.id}`);
  await db.destroy();
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
