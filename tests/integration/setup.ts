import { randomBytes } from "node:crypto";
import { afterAll } from "vitest";
import { closePool } from "@/db/pool";
import { adminUrl, assertLoopback, TEMPLATE_DB, withAdminClient } from "../support/test-database";

// Runs before each test file: a fresh copy of the migrated template, dropped afterwards.
const base = process.env.TEST_DATABASE_URL;
if (!base) throw new Error("TEST_DATABASE_URL is not set");
assertLoopback(base);
const name = `cellwright_it_${randomBytes(4).toString("hex")}`;
await withAdminClient(base, (c) => c.query(`create database ${name} template ${TEMPLATE_DB}`));
process.env.DATABASE_URL = adminUrl(base, name);

afterAll(async () => {
  await closePool();
  await withAdminClient(base, (c) => c.query(`drop database if exists ${name} with (force)`));
});
