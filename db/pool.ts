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
  if (!globalForPool.cellwrightPool) {
    const pool = new pg.Pool({ connectionString: getDatabaseUrl(), max: 10 });
    // An idle connection dropped by the server (a restart, a failover) is reported here; without a listener
    // pg re-throws it as an uncaught exception. The pool opens a new connection on the next query.
    pool.on("error", (error) => {
      console.warn(`database connection lost while idle (${(error as { code?: string }).code ?? error.message}); the next request reconnects`);
    });
    globalForPool.cellwrightPool = pool;
  }
  return globalForPool.cellwrightPool;
}

export async function closePool(): Promise<void> {
  const pool = globalForPool.cellwrightPool;
  globalForPool.cellwrightPool = undefined;
  await pool?.end();
}
