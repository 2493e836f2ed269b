// The choices the lot and specimen forms offer, as the server loads them (lib/specimens/form-options.ts).

/** A cell specification as people pick it: "Maker Model (designation)". */
export interface SpecificationOption {
  id: string;
  label: string;
}

/** A lot a specimen can come from. */
export interface LotOption {
  id: string;
  label: string;
  cellSpecificationId: string;
  receivedOn: string;
  quantityReceived: number;
}
