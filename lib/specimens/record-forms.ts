import type { LotInput } from "@/lib/lots/lot-input";
import type { SpecimenInput } from "./specimen-input";

const reader = (form: FormData) => (k: string) => String(form.get(k) ?? "").trim();

/** The lot form in the shape the schema checks; a quantity that is not a number stays text so the schema names it. */
export function readLotForm(form: FormData): unknown {
  const text = reader(form);
  const quantity = text("quantityReceived");
  return {
    identifier: text("identifier"),
    cellSpecificationId: text("cellSpecificationId"),
    supplier: text("supplier"),
    customer: text("customer"),
    quantityReceived: quantity === "" ? undefined : Number.isFinite(Number(quantity)) ? Number(quantity) : quantity,
    receivedOn: text("receivedOn"),
    notes: text("notes"),
  } satisfies Record<keyof LotInput, unknown>;
}

/** The specimen form in the shape the schema checks; "no lot" and "no tray position" are sent as empty text. */
export function readSpecimenForm(form: FormData): unknown {
  const text = reader(form);
  const position = text("lotPosition");
  return {
    identifier: text("identifier"),
    cellSpecificationId: text("cellSpecificationId"),
    lotId: text("lotId") || null,
    lotPosition: position === "" ? null : Number.isFinite(Number(position)) ? Number(position) : position,
    receivedOn: text("receivedOn"),
    conditionOnReceipt: text("conditionOnReceipt"),
    notes: text("notes"),
  } satisfies Record<keyof SpecimenInput, unknown>;
}
