import { randomBytes } from "node:crypto";
import { afterAll } from "vitest";
import { closePool } from "@/db/pool";
import { adminUrl, TEMPLATE_DB, testDatabaseUrls, withAdminClient } from "../support/test-database";

// Runs before each test file: a fresh copy of the migrated template, dropped afterwards. The code under
// test connects as the app role, never as the owner or the superuser; OWNER_DATABASE_URL is for setup
// the app may not do (withOwnerClient).
const { admin: base, owner, app } = testDatabaseUrls();
const name = `cellwright_it_${randomBytes(4).toString("hex")}`;
await withAdminClient(base, async (c) => {
  await c.query(`create database ${name} template ${TEMPLATE_DB} owner cellwright_owner`);
  // A copy does not inherit the template's database rights: as migration 0009 does, no temporary tables.
  await c.query(`revoke temporary on database ${name} from public`);
});
process.env.DATABASE_URL = adminUrl(app, name);
process.env.OWNER_DATABASE_URL = adminUrl(owner, name);

afterAll(async () => {
  await closePool();
  // pool.end() resolves before its sockets have closed; a forced drop at that moment kills them and the
  // dying clients report it as an error of this file. Wait for them to go; force only as a last resort.
  await withAdminClient(base, async (c) => {
    for (let attempt = 0; attempt < 30; attempt++) {
      const open = await c.query("select count(*)::int as n from pg_stat_activity where datname = $1", [name]);
      if (open.rows[0].n === 0) break;
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
    await c.query(`drop database if exists ${name} with (force)`);
  });
});
