import pg from "pg";

/** Tests only ever touch a database on this machine. */
export function assertLoopback(url: string): void {
  const host = new URL(url).hostname;
  if (!["127.0.0.1", "localhost", "::1", "[::1]"].includes(host)) {
    throw new Error(`refusing to run tests against a non-loopback database: ${host}`);
  }
}

export function adminUrl(baseUrl: string, database = "postgres"): string {
  const u = new URL(baseUrl);
  u.pathname = `/${database}`;
  return u.toString();
}

export async function withAdminClient<T>(baseUrl: string, fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: adminUrl(baseUrl) });
  await client.connect();
  try {
    return await fn(client);
  } finally {
    await client.end();
  }
}

export const TEMPLATE_DB = "cellwright_it_template";

/**
 * The test cluster's three sign-ins (scripts/test.sh exports them): the superuser creates and drops
 * databases, the owner role migrates, the app role is what the code under test connects as.
 */
export function testDatabaseUrls(): { admin: string; owner: string; app: string } {
  const admin = process.env.TEST_DATABASE_URL;
  const owner = process.env.TEST_OWNER_DATABASE_URL;
  const app = process.env.TEST_APP_DATABASE_URL;
  if (!admin || !owner || !app) {
    throw new Error("TEST_DATABASE_URL, TEST_OWNER_DATABASE_URL and TEST_APP_DATABASE_URL must be set: run the integration tests through `npm test`");
  }
  for (const url of [admin, owner, app]) assertLoopback(url);
  return { admin, owner, app };
}

/** For setup the app role may not do (and for proving the owner role is refused too): this file's database as its owner. */
export async function withOwnerClient<T>(fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const url = process.env.OWNER_DATABASE_URL;
  if (!url) throw new Error("OWNER_DATABASE_URL is not set (tests/integration/setup.ts sets it)");
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return await fn(client);
  } finally {
    await client.end();
  }
}

/**
 * Writes what the database would refuse, as the owner with one trigger off for one transaction: for tests
 * proving the app's own checks still catch a record forged past the database (the app's role cannot do this).
 */
export async function forgeAsOwner(table: string, trigger: string, statement: string, params: unknown[] = []): Promise<void> {
  await withOwnerClient(async (c) => {
    await c.query("begin");
    try {
      await c.query(`alter table ${table} disable trigger ${trigger}`);
      await c.query(statement, params);
      await c.query(`alter table ${table} enable trigger ${trigger}`);
      await c.query("commit");
    } catch (error) {
      await c.query("rollback");
      throw error;
    }
  });
}
