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
