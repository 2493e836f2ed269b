import { Kysely, Migrator, PostgresDialect } from "kysely";
import pg from "pg";
import { MIGRATIONS } from "../migrations/index";

/** Applies every pending migration in migrations/; the CLI exits 1 on failure. */
export async function migrateToLatest(databaseUrl: string, log: (line: string) => void = console.log): Promise<void> {
  const db = new Kysely<unknown>({
    dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: databaseUrl, max: 1 }) }),
  });
  const migrator = new Migrator({ db, provider: { getMigrations: async () => MIGRATIONS } });
  try {
    const { error, results } = await migrator.migrateToLatest();
    for (const r of results ?? []) log(`${r.status === "Success" ? "applied" : r.status}: ${r.migrationName}`);
    if (error) throw error;
  } finally {
    await db.destroy();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error("DATABASE_URL is not set");
    process.exit(1);
  }
  migrateToLatest(url).then(
    () => console.log("migrations up to date"),
    (err: unknown) => {
      console.error("migration failed:", err);
      process.exit(1);
    },
  );
}
