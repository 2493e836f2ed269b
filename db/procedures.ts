import "server-only";
import { sql } from "kysely";
import type { RichTextDoc } from "@/lib/rich-text";
import type { Procedure } from "@/protocols";
import type { Executor } from "./index";
import type { ProcedureStatus } from "./schema";

export type { ProcedureStatus };

export interface ProcedureVersionView {
  id: string;
  procedureId: string;
  code: string;
  number: number;
  status: ProcedureStatus;
  title: string;
  definition: Procedure;
  instructions: RichTextDoc;
  cautions: RichTextDoc;
  acknowledgedCautions: string[];
  author: { id: string; name: string };
  submittedBy: { id: string; name: string; at: Date } | null;
  releasedBy: { id: string; name: string; at: Date } | null;
  withdrawn: { by: string; at: Date; reason: string } | null;
  updatedAt: Date;
}

function versionQuery(db: Executor) {
  return db
    .selectFrom("procedure_version as v")
    .innerJoin("procedure as p", "p.id", "v.procedure_id")
    .innerJoin("app_user as author", "author.id", "v.author_id")
    .leftJoin("app_user as submitter", "submitter.id", "v.submitted_by")
    .leftJoin("app_user as releaser", "releaser.id", "v.released_by")
    .leftJoin("app_user as withdrawer", "withdrawer.id", "v.withdrawn_by")
    .select([
      "v.id",
      "v.procedure_id",
      "p.code",
      "v.number",
      "v.status",
      "v.title",
      "v.definition",
      "v.instructions_doc",
      "v.cautions_doc",
      "v.acknowledged_cautions",
      "v.author_id",
      "author.display_name as author_name",
      "v.submitted_by",
      "submitter.display_name as submitter_name",
      "v.submitted_at",
      "v.released_by",
      "releaser.display_name as releaser_name",
      "v.released_at",
      "withdrawer.display_name as withdrawer_name",
      "v.withdrawn_at",
      "v.withdrawal_reason",
      "v.updated_at",
    ]);
}

type Row = Awaited<ReturnType<ReturnType<typeof versionQuery>["executeTakeFirstOrThrow"]>>;

function toView(r: Row): ProcedureVersionView {
  return {
    id: r.id,
    procedureId: r.procedure_id,
    code: r.code,
    number: r.number,
    status: r.status,
    title: r.title,
    // Stored only after validation against procedureSchema (lib/procedures).
    definition: r.definition as Procedure,
    instructions: (r.instructions_doc ?? null) as RichTextDoc,
    cautions: (r.cautions_doc ?? null) as RichTextDoc,
    acknowledgedCautions: r.acknowledged_cautions,
    author: { id: r.author_id, name: r.author_name },
    submittedBy: r.submitted_by && r.submitted_at ? { id: r.submitted_by, name: r.submitter_name ?? "", at: r.submitted_at } : null,
    releasedBy: r.released_by && r.released_at ? { id: r.released_by, name: r.releaser_name ?? "", at: r.released_at } : null,
    withdrawn: r.withdrawn_at ? { by: r.withdrawer_name ?? "", at: r.withdrawn_at, reason: r.withdrawal_reason ?? "" } : null,
    updatedAt: r.updated_at,
  };
}

export async function getProcedureVersion(db: Executor, procedureId: string, number: number): Promise<ProcedureVersionView | null> {
  const r = await versionQuery(db).where("v.procedure_id", "=", procedureId).where("v.number", "=", number).executeTakeFirst();
  return r ? toView(r) : null;
}

export async function getProcedureVersionById(db: Executor, id: string, opts: { forUpdate?: boolean } = {}): Promise<ProcedureVersionView | null> {
  if (opts.forUpdate) await db.selectFrom("procedure_version").select("id").where("id", "=", id).forUpdate().execute();
  const r = await versionQuery(db).where("v.id", "=", id).executeTakeFirst();
  return r ? toView(r) : null;
}

export async function listProcedureVersions(db: Executor, procedureId: string): Promise<ProcedureVersionView[]> {
  return (await versionQuery(db).where("v.procedure_id", "=", procedureId).orderBy("v.number", "desc").execute()).map(toView);
}

/** Each version's number and status, without its content (what a choice of versions needs). */
export async function listProcedureVersionStates(
  db: Executor,
  procedureId: string,
): Promise<{ id: string; code: string; number: number; status: ProcedureVersionView["status"] }[]> {
  return db
    .selectFrom("procedure_version as v")
    .innerJoin("procedure as p", "p.id", "v.procedure_id")
    .select(["v.id", "p.code", "v.number", "v.status"])
    .where("v.procedure_id", "=", procedureId)
    .orderBy("v.number", "desc")
    .execute();
}

export interface ProcedureSummary {
  id: string;
  code: string;
  title: string;
  standard: string;
  clause: string;
  latestNumber: number;
  latestStatus: ProcedureStatus;
  releasedNumber: number | null;
  updatedAt: Date;
}

/**
 * One line per procedure: its newest version (title, status) and the newest released one. Filters:
 * free text on code, title, standard; `status` keeps procedures whose newest version has it.
 */
export async function listProcedures(
  db: Executor,
  filter: { q?: string; status?: ProcedureStatus; releasedOnly?: boolean } = {},
): Promise<ProcedureSummary[]> {
  let q = db
    .selectFrom("procedure as p")
    .innerJoinLateral(
      (eb) =>
        eb
          .selectFrom("procedure_version")
          .select(["number", "status", "title", "definition", "updated_at"])
          .whereRef("procedure_id", "=", "p.id")
          .orderBy("number", "desc")
          .limit(1)
          .as("latest"),
      (join) => join.onTrue(),
    )
    .select((eb) => [
      "p.id",
      "p.code",
      "latest.title",
      "latest.number",
      "latest.status",
      "latest.updated_at",
      sql<string>`latest.definition #>> '{header,standard}'`.as("standard"),
      sql<string>`latest.definition #>> '{header,clause}'`.as("clause"),
      eb
        .selectFrom("procedure_version as r")
        .select((e) => e.fn.max("r.number").as("n"))
        .whereRef("r.procedure_id", "=", "p.id")
        .where("r.status", "=", "released")
        .as("released_number"),
    ])
    .orderBy("p.code");
  if (filter.status) q = q.where("latest.status", "=", filter.status);
  if (filter.releasedOnly) {
    q = q.where((eb) =>
      eb.exists(eb.selectFrom("procedure_version as r2").select("r2.id").whereRef("r2.procedure_id", "=", "p.id").where("r2.status", "=", "released")),
    );
  }
  if (filter.q) {
    const like = `%${filter.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
    q = q.where((eb) =>
      eb.or([eb("p.code", "ilike", like), eb("latest.title", "ilike", like), eb(sql`latest.definition #>> '{header,standard}'`, "ilike", like)]),
    );
  }
  const rows = await q.execute();
  return rows.map((r) => ({
    id: r.id,
    code: r.code,
    title: r.title,
    standard: r.standard ?? "",
    clause: r.clause ?? "",
    latestNumber: r.number,
    latestStatus: r.status,
    releasedNumber: r.released_number === null ? null : Number(r.released_number),
    updatedAt: r.updated_at,
  }));
}

export async function getProcedureIdByCode(db: Executor, code: string): Promise<string | null> {
  const r = await db.selectFrom("procedure").select("id").where("code", "=", code).executeTakeFirst();
  return r?.id ?? null;
}

export async function insertProcedure(db: Executor, p: { code: string; createdBy: string }): Promise<string> {
  const r = await db.insertInto("procedure").values({ code: p.code, created_by: p.createdBy }).returning("id").executeTakeFirstOrThrow();
  return r.id;
}

export interface VersionContent {
  definition: Procedure;
  instructions: RichTextDoc;
  cautions: RichTextDoc;
  acknowledgedCautions: string[];
}

function contentColumns(c: VersionContent) {
  return {
    title: c.definition.header.title,
    definition: JSON.stringify(c.definition),
    instructions_doc: c.instructions ? JSON.stringify(c.instructions) : null,
    cautions_doc: c.cautions ? JSON.stringify(c.cautions) : null,
    acknowledged_cautions: JSON.stringify([...new Set(c.acknowledgedCautions)].sort()),
  };
}

export async function insertProcedureVersion(
  db: Executor,
  v: { procedureId: string; number: number; authorId: string } & VersionContent,
): Promise<string> {
  const r = await db
    .insertInto("procedure_version")
    .values({ procedure_id: v.procedureId, number: v.number, author_id: v.authorId, ...contentColumns(v) })
    .returning("id")
    .executeTakeFirstOrThrow();
  return r.id;
}

export async function updateProcedureVersionContent(db: Executor, id: string, c: VersionContent): Promise<void> {
  await db.updateTable("procedure_version").set({ ...contentColumns(c), updated_at: new Date() }).where("id", "=", id).execute();
}

export async function setProcedureVersionStatus(
  db: Executor,
  id: string,
  change:
    | { status: "in_review"; by: string }
    | { status: "draft" }
    | { status: "released"; by: string }
    | { status: "withdrawn"; by: string; reason: string },
): Promise<void> {
  const now = new Date();
  const set =
    change.status === "in_review"
      ? { status: change.status, submitted_by: change.by, submitted_at: now }
      : change.status === "draft"
        ? { status: change.status, submitted_by: null, submitted_at: null }
        : change.status === "released"
          ? { status: change.status, released_by: change.by, released_at: now }
          : { status: change.status, withdrawn_by: change.by, withdrawn_at: now, withdrawal_reason: change.reason };
  // updated_at is the author's "last saved": a change of status leaves it as it was.
  await db.updateTable("procedure_version").set(set).where("id", "=", id).execute();
}

export async function nextVersionNumber(db: Executor, procedureId: string): Promise<number> {
  const r = await db
    .selectFrom("procedure_version")
    .select((eb) => eb.fn.max("number").as("n"))
    .where("procedure_id", "=", procedureId)
    .executeTakeFirst();
  return Number(r?.n ?? 0) + 1;
}
