import { z } from "zod";
import { accuracySpecificationSchema, findAccuracyProblems } from "./accuracy";
import { calendarDateSchema } from "./calendar-date";
import { INSTRUMENT_KINDS } from "./instrument-kind";
import { optionalTextSchema, recordIdentifierSchema } from "./record-identifier";

/** One instrument as the register holds it; shared by the form, the server action and the API. */
export const instrumentInputSchema = z
  .object({
    kind: z.enum(INSTRUMENT_KINDS, { error: "Choose the kind of instrument." }),
    identifier: recordIdentifierSchema("identifier"),
    serial: z.string({ error: "required" }).trim().min(1, { error: "Give the maker's serial number." }).max(100, { error: "The serial number has at most 100 characters." }),
    firmware: optionalTextSchema(60),
    accuracy: accuracySpecificationSchema,
    calibrationCertificate: z.string({ error: "required" }).trim().min(1, { error: "Give the calibration certificate number." }).max(100, { error: "The calibration certificate number has at most 100 characters." }),
    calibratedOn: calendarDateSchema,
    dueOn: calendarDateSchema,
  })
  .superRefine((v, ctx) => {
    // YYYY-MM-DD text sorts as the dates do.
    if (v.dueOn <= v.calibratedOn) ctx.addIssue({ code: "custom", path: ["dueOn"], message: "The due date must be after the calibration date." });
    for (const p of findAccuracyProblems(v.kind, v.accuracy)) ctx.addIssue({ code: "custom", path: ["accuracy", p.quantity], message: p.message });
  });
export type InstrumentInput = z.infer<typeof instrumentInputSchema>;
