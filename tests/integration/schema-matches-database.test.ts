import path from "node:path";
import ts from "typescript";
import { describe, expect, it } from "vitest";
import { withOwnerClient } from "../support/test-database";

// db/schema.ts is written by hand beside the migrations (DEVELOPERS.md, "Add a migration"). This test
// reads its Database type with the TypeScript checker and compares it with the migrated database:
// every table, every column, and whether each may be null.

const root = path.resolve(import.meta.dirname, "../..");
/** Kysely's own bookkeeping, not part of the Database type. */
const KYSELY_TABLES = new Set(["kysely_migration", "kysely_migration_lock"]);

interface ColumnShape {
  /** null when the type does not say (a JSON column typed `unknown`). */
  nullable: boolean | null;
}

/** Table → column → nullability, as db/schema.ts's Database type states them (the type a select reads). */
function readSchemaType(): Map<string, Map<string, ColumnShape>> {
  const file = path.join(root, "db/schema.ts");
  const program = ts.createProgram([file], { strict: true, target: ts.ScriptTarget.ES2022, moduleResolution: ts.ModuleResolutionKind.Bundler, module: ts.ModuleKind.ESNext, skipLibCheck: true, noEmit: true });
  const checker = program.getTypeChecker();
  const source = program.getSourceFile(file);
  if (!source) throw new Error("db/schema.ts not found");
  const database = source.statements.find((s): s is ts.InterfaceDeclaration => ts.isInterfaceDeclaration(s) && s.name.text === "Database");
  if (!database) throw new Error("db/schema.ts has no Database interface");
  const tables = new Map<string, Map<string, ColumnShape>>();
  for (const table of checker.getTypeAtLocation(database).getProperties()) {
    const columns = new Map<string, ColumnShape>();
    for (const column of checker.getTypeOfSymbol(table).getProperties()) {
      let type = checker.getTypeOfSymbol(column);
      // ColumnType<Select, Insert, Update> (and Generated<T>) carry the selected type in __select__.
      const selected = type.getProperty("__select__");
      if (selected) type = checker.getTypeOfSymbol(selected);
      const nullable = type.flags & ts.TypeFlags.Unknown || type.flags & ts.TypeFlags.Any ? null : type.isUnion() ? type.types.some((t) => t.flags & ts.TypeFlags.Null) : Boolean(type.flags & ts.TypeFlags.Null);
      columns.set(column.name, { nullable });
    }
    tables.set(table.name, columns);
  }
  return tables;
}

async function readDatabase(): Promise<Map<string, Map<string, { nullable: boolean }>>> {
  const { rows } = await withOwnerClient((c) =>
    c.query<{ table_name: string; column_name: string; is_nullable: "YES" | "NO" }>(
      `select c.table_name, c.column_name, c.is_nullable
         from information_schema.columns c
         join information_schema.tables t on t.table_schema = c.table_schema and t.table_name = c.table_name
        where c.table_schema = 'public' and t.table_type = 'BASE TABLE'
        order by c.table_name, c.ordinal_position`,
    ),
  );
  const tables = new Map<string, Map<string, { nullable: boolean }>>();
  for (const r of rows) {
    if (KYSELY_TABLES.has(r.table_name)) continue;
    if (!tables.has(r.table_name)) tables.set(r.table_name, new Map());
    tables.get(r.table_name)!.set(r.column_name, { nullable: r.is_nullable === "YES" });
  }
  return tables;
}

describe("db/schema.ts against the migrated database", () => {
  const typed = readSchemaType();

  it("reads the Database type (a check of the reader itself)", () => {
    expect(typed.get("run")?.get("number")).toEqual({ nullable: false });
    expect(typed.get("run")?.get("started_at")?.nullable).toBe(true);
    expect(typed.get("run_evaluation")?.get("evaluation")).toEqual({ nullable: null });
  });

  it("names every table of the database, and no other", async () => {
    const database = await readDatabase();
    expect([...typed.keys()].sort()).toEqual([...database.keys()].sort());
  });

  it("names every column of each table, and no other", async () => {
    const database = await readDatabase();
    const differences: string[] = [];
    for (const [table, columns] of database) {
      const typedColumns = typed.get(table);
      if (!typedColumns) continue;
      for (const column of columns.keys()) if (!typedColumns.has(column)) differences.push(`${table}.${column} is in the database, not in db/schema.ts`);
      for (const column of typedColumns.keys()) if (!columns.has(column)) differences.push(`${table}.${column} is in db/schema.ts, not in the database`);
    }
    expect(differences).toEqual([]);
  });

  it("types a column as possibly null exactly when the database allows null", async () => {
    const database = await readDatabase();
    const differences: string[] = [];
    for (const [table, columns] of database) {
      for (const [column, { nullable }] of columns) {
        const typedNullable = typed.get(table)?.get(column)?.nullable;
        if (typedNullable === undefined || typedNullable === null) continue;
        if (typedNullable !== nullable) differences.push(`${table}.${column}: database ${nullable ? "null allowed" : "not null"}, db/schema.ts ${typedNullable ? "| null" : "never null"}`);
      }
    }
    expect(differences).toEqual([]);
  });
});
