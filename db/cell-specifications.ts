import "server-only";
import type { CellSpecification } from "@/protocols";
import type { Executor } from "./index";

export interface CellSpecificationView {
  id: string;
  maker: string;
  model: string;
  designation: string;
  data: CellSpecification;
  datasheet: { fileId: string; name: string; sizeBytes: number; sha256: string } | null;
  updatedAt: Date;
}

function base(db: Executor) {
  return db
    .selectFrom("cell_specification as s")
    .leftJoin("stored_file as f", "f.id", "s.datasheet_file_id")
    .select([
      "s.id",
      "s.maker",
      "s.model",
      "s.designation",
      "s.data",
      "s.updated_at",
      "f.id as file_id",
      "f.original_name as file_name",
      "f.size_bytes as file_size",
      "f.sha256 as file_sha256",
    ]);
}

type Row = Awaited<ReturnType<ReturnType<typeof base>["executeTakeFirstOrThrow"]>>;

function toView(r: Row): CellSpecificationView {
  return {
    id: r.id,
    maker: r.maker,
    model: r.model,
    designation: r.designation,
    // Stored only after validation against cellSpecificationSchema (lib/specs).
    data: r.data as CellSpecification,
    datasheet: r.file_id
      ? { fileId: r.file_id, name: r.file_name ?? "datasheet.pdf", sizeBytes: Number(r.file_size), sha256: r.file_sha256 ?? "" }
      : null,
    updatedAt: r.updated_at,
  };
}

export async function listCellSpecifications(db: Executor, filter: { q?: string } = {}): Promise<CellSpecificationView[]> {
  let q = base(db).orderBy("s.maker").orderBy("s.model");
  if (filter.q) {
    const like = `%${filter.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
    q = q.where((eb) => eb.or([eb("s.maker", "ilike", like), eb("s.model", "ilike", like), eb("s.designation", "ilike", like)]));
  }
  return (await q.execute()).map(toView);
}

export async function getCellSpecification(db: Executor, id: string): Promise<CellSpecificationView | null> {
  const r = await base(db).where("s.id", "=", id).executeTakeFirst();
  return r ? toView(r) : null;
}

export async function insertCellSpecification(
  db: Executor,
  s: { maker: string; model: string; designation: string; data: CellSpecification; createdBy: string },
): Promise<string> {
  const r = await db
    .insertInto("cell_specification")
    .values({ maker: s.maker, model: s.model, designation: s.designation, data: JSON.stringify(s.data), created_by: s.createdBy })
    .returning("id")
    .executeTakeFirstOrThrow();
  return r.id;
}

export async function updateCellSpecification(
  db: Executor,
  id: string,
  s: { maker: string; model: string; designation: string; data: CellSpecification },
): Promise<void> {
  await db
    .updateTable("cell_specification")
    .set({ maker: s.maker, model: s.model, designation: s.designation, data: JSON.stringify(s.data), updated_at: new Date() })
    .where("id", "=", id)
    .executeTakeFirstOrThrow();
}

export async function setDatasheet(db: Executor, specId: string, fileId: string): Promise<void> {
  await db.updateTable("cell_specification").set({ datasheet_file_id: fileId, updated_at: new Date() }).where("id", "=", specId).execute();
}

export async function lockCellSpecification(db: Executor, id: string): Promise<boolean> {
  const r = await db.selectFrom("cell_specification").select("id").where("id", "=", id).forUpdate().executeTakeFirst();
  return Boolean(r);
}
