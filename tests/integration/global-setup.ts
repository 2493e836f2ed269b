import { migrateToLatest } from "../../scripts/migrate";
import { adminUrl, TEMPLATE_DB, testDatabaseUrls, withAdminClient } from "../support/test-database";

/**
 * Builds a migrated template database once per test run; each test file then gets its own copy
 * (CREATE DATABASE … TEMPLATE), which is much faster than migrating per file. The owner role owns it
 * and runs the migrations, as in production (docs/deployment-database.md).
 */
export default async function setup(): Promise<void> {
  const { admin, owner } = testDatabaseUrls();
  await withAdminClient(admin, async (c) => {
    await c.query(`drop database if exists ${TEMPLATE_DB} with (force)`);
    await c.query(`create database ${TEMPLATE_DB} owner cellwright_owner`);
  });
  await migrateToLatest(adminUrl(owner, TEMPLATE_DB));
}
