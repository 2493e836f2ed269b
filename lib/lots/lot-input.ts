import { z } from "zod";
import { calendarDateSchema } from "@/lib/instruments/calendar-date";
import { optionalTextSchema, recordIdentifierSchema } from "@/lib/instruments/record-identifier";

/** Cells received together from one supplier; shared by the form, the server action and the API. */
export const lotInputSchema = z.object({
  identifier: recordIdentifierSchema("lot identifier"),
  cellSpecificationId: z.uuid({ error: "Choose the cell specification." }),
  supplier: z.string({ error: "required" }).trim().min(1, { error: "Name the supplier." }).max(120, { error: "The supplier's name has at most 120 characters." }),
  /** Who the results are reported to (ISO/IEC 17025:2017 7.8.2.1 e); empty for the lab's own work. */
  customer: optionalTextSchema(200),
  quantityReceived: z
    .number({ error: (i) => (i.input === undefined ? "required" : "The quantity is a whole number of cells.") })
    .int({ error: "The quantity is a whole number of cells." })
    .positive({ error: "The quantity received must be at least one cell." })
    .max(10_000_000, { error: "A lot holds at most 10 000 000 cells." }),
  receivedOn: calendarDateSchema,
  notes: optionalTextSchema(2000),
});
export type LotInput = z.infer<typeof lotInputSchema>;
