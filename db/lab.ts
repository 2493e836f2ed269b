import "server-only";
import type { Executor } from "./index";

export interface LabView {
  name: string;
  address: string;
  accreditation: string | null;
}

export async function getLab(db: Executor): Promise<LabView | null> {
  const row = await db.selectFrom("lab").select(["name", "address", "accreditation"]).executeTakeFirst();
  return row ?? null;
}

export async function upsertLab(db: Executor, lab: LabView): Promise<void> {
  await db
    .insertInto("lab")
    .values({ id: 1, ...lab })
    .onConflict((oc) => oc.column("id").doUpdateSet({ ...lab, updated_at: new Date() }))
    .execute();
}
