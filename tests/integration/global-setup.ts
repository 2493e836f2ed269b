import { migrateToLatest } from "../../scripts/migrate";
import { adminUrl, assertLoopback, TEMPLATE_DB, withAdminClient } from "../support/test-database";

/**
 * Builds a migrated template database once per test run; each test file then gets its own copy
 * (CREATE DATABASE … TEMPLATE), which is much faster than migrating per file.
 */
export default async function setup(): Promise<void> {
  const base = process.env.TEST_DATABASE_URL;
  if (!base) throw new Error("TEST_DATABASE_URL is not set: run the integration tests through `npm test`");
  assertLoopback(base);
  await withAdminClient(base, async (c) => {
    await c.query(`drop database if exists ${TEMPLATE_DB} with (force)`);
    await c.query(`create database ${TEMPLATE_DB}`);
  });
  await migrateToLatest(adminUrl(base, TEMPLATE_DB));
}
