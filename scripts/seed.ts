import { hash, verify } from "@node-rs/argon2";
import { generateIdFromEntropySize } from "lucia";
import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import type { Database } from "../db/schema";
import { closePool } from "../db/pool";
import { repairFramedObjects } from "../lib/integrity/repair-framed-objects";
import { DEMO_LAB, DEMO_USERS } from "../scenarios/demo-lab";
import { seedDemoLot } from "./seed-demo-lot";
import { seedEnduranceRun } from "./seed-endurance-run";
import { seedEnduranceTrendRun } from "./seed-endurance-trend";
import { seedLibrary } from "./seed-library";

/**
 * Seeds the demo lab: its users, then its library of cell specifications and released procedures
 * (through the same services the app uses, so the audit trail tells the story). Idempotent: existing users keep their passwords and roles, so running the
 * demo twice never undoes what someone changed in it.
 */
/** The demo passwords before the password policy of docs/security.md (shorter than 12 or naming the role). */
const LEGACY_DEMO_PASSWORDS: Partial<Record<string, string>> = {
  admin: "demo-admin-pass",
  engineer: "demo-engineer-pass",
  operator: "demo-operator-pass",
  auditor: "demo-auditor-pass",
};

export async function seedDemo(databaseUrl: string): Promise<{ created: string[] }> {
  const db = new Kysely<Database>({
    dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: databaseUrl, max: 2 }) }),
  });
  const created: string[] = [];
  try {
    await db.transaction().execute(async (tx) => {
      await tx
        .insertInto("lab")
        .values({ id: 1, ...DEMO_LAB })
        .onConflict((oc) => oc.column("id").doNothing())
        .execute();
      for (const u of DEMO_USERS) {
        const exists = await tx.selectFrom("app_user").select(["id", "password_hash"]).where("email", "=", u.email).executeTakeFirst();
        if (exists) {
          // A demo made before the password policy still has its old, too-weak demo password: move it to the printed one.
          const old = LEGACY_DEMO_PASSWORDS[u.role];
          if (old && (await verify(exists.password_hash, old).catch(() => false))) {
            await tx.updateTable("app_user").set({ password_hash: await hash(u.password) }).where("id", "=", exists.id).execute();
          }
          continue;
        }
        const id = generateIdFromEntropySize(10);
        await tx
          .insertInto("app_user")
          .values({ id, email: u.email, display_name: u.displayName, role: u.role, password_hash: await hash(u.password) })
          .execute();
        await tx
          .insertInto("audit_event")
          .values({
            actor_id: null,
            actor_label: "demo seed",
            action: "user.create",
            entity_type: "user",
            entity_id: id,
            after: JSON.stringify({ email: u.email, displayName: u.displayName, role: u.role, active: true }),
          })
          .execute();
        created.push(u.email);
      }
    });
  } finally {
    await db.destroy();
  }
  created.push(...(await seedLibrary()));
  // After the library: the second lot needs its cell specification, procedures and instruments.
  created.push(...(await seedDemoLot()));
  created.push(...(await seedEnduranceRun()));
  created.push(...(await seedEnduranceTrendRun()));
  // Demo databases made before uploads were stored byte-exact hold framed objects: put the sent bytes back.
  const repairs = await repairFramedObjects("demo seed");
  created.push(...repairs.repaired);
  for (const problem of repairs.unrepaired) console.warn(`not repaired: ${problem} Drop the demo database to seed it afresh.`);
  await closePool();
  return { created };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error("DATABASE_URL is not set");
    process.exit(1);
  }
  seedDemo(url).then(
    ({ created }) => console.log(created.length ? `seeded: ${created.join(", ")}` : "demo data already present"),
    (err: unknown) => {
      console.error("seeding failed:", err);
      process.exit(1);
    },
  );
}
