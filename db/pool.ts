import pg from "pg";

/**
 * One shared pg.Pool per process, kept on globalThis so Next's module reloading in development
 * does not open a new pool each time. Kysely and the session library both use it.
 */
const globalForPool = globalThis as unknown as { cellwrightPool?: pg.Pool };

export function getDatabaseUrl(): string {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set (the scripts in scripts/ set it)");
  return url;
}

export function getPool(): pg.Pool {
  globalForPool.cellwrightPool ??= new pg.Pool({ connectionString: getDatabaseUrl(), max: 10 });
  return globalForPool.cellwrightPool;
}

export async function closePool(): Promise<void> {
  const pool = globalForPool.cellwrightPool;
  globalForPool.cellwrightPool = undefined;
  await pool?.end();
}
