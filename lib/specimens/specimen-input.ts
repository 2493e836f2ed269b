import { z } from "zod";
import { calendarDateSchema } from "@/lib/instruments/calendar-date";
import { optionalTextSchema, recordIdentifierSchema } from "@/lib/instruments/record-identifier";

/** One physical cell; shared by the form, the server action and the API. A specimen of a lot is of the lot's cell specification. */
export const specimenInputSchema = z.object({
  identifier: recordIdentifierSchema("specimen identifier"),
  cellSpecificationId: z.uuid({ error: "Choose the cell specification." }),
  lotId: z
    .uuid({ error: "Choose a lot from the list, or none." })
    .nullish()
    .transform((v) => v ?? null),
  /** Which cell of the lot this is, as numbered on the tray (1…lot size); the lot's drawn sample names positions. */
  lotPosition: z
    .number({ error: "The tray position is a whole number, 1 or more." })
    .int({ error: "The tray position is a whole number, 1 or more." })
    .min(1, { error: "The tray position is a whole number, 1 or more." })
    .nullish()
    .transform((v) => v ?? null),
  receivedOn: calendarDateSchema,
  conditionOnReceipt: z.string({ error: "required" }).trim().min(1, { error: "Describe the condition on receipt." }).max(500, { error: "Describe the condition in at most 500 characters." }),
  notes: optionalTextSchema(2000),
});
export type SpecimenInput = z.input<typeof specimenInputSchema>;
export type SpecimenValues = z.output<typeof specimenInputSchema>;
