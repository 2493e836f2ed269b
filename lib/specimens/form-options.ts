import "server-only";
import { getDb } from "@/db";
import { listCellSpecifications } from "@/db/cell-specifications";
import { listLots } from "@/db/lots";
import type { LotOption, SpecificationOption } from "./form-option-types";

/** The cell specifications a lot or specimen can be of, labelled as people pick them. */
export async function loadSpecificationOptions(): Promise<SpecificationOption[]> {
  const specs = await listCellSpecifications(getDb());
  return specs.map((s) => ({ id: s.id, label: `${s.maker} ${s.model} (${s.designation})` }));
}

/** Lots a specimen can come from, newest receipt first. */
export async function loadLotOptions(): Promise<LotOption[]> {
  const lots = await listLots(getDb());
  return lots.map((l) => ({
    id: l.id,
    label: `${l.identifier} (${l.specification.maker} ${l.specification.model})`,
    cellSpecificationId: l.specification.id,
    receivedOn: l.receivedOn,
    quantityReceived: l.quantityReceived,
  }));
}
