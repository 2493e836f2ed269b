import { z } from "zod";

/** An AQL as a number (1) or as the table heads its column ("1.0"); planSampling says whether it is a column. */
const aqlSchema = z.union([z.number(), z.string().trim().min(1, { error: "Choose the AQL (acceptance quality limit)." })], {
  error: "Choose the AQL (acceptance quality limit).",
});

/**
 * The engineer's choice for a lot: inspection level and AQL (the lot size is the lot's quantity),
 * and optionally the procedure whose statement of conformity decides each drawn cell. Whether the
 * level and AQL make a plan is planSampling's to say, with its own message.
 */
export const lotSamplingPlanInputSchema = z.object({
  inspectionLevel: z.string({ error: "Choose the inspection level." }).trim().min(1, { error: "Choose the inspection level." }),
  aql: aqlSchema,
  acceptanceProcedureId: z
    .uuid({ error: "Choose a released procedure from the list, or any procedure." })
    .nullish()
    .transform((v) => v ?? null),
});
export type LotSamplingPlanInput = z.input<typeof lotSamplingPlanInputSchema>;

/** `POST /api/sampling-plan`: a plan for any lot size, for tools outside the workbench. */
export const samplingPlanRequestSchema = z.object({
  lotSize: z.number({ error: "Give the lot size: the number of cells in the lot." }),
  inspectionLevel: z.string({ error: "Give the inspection level: S-1 to S-4, I, II or III." }),
  aql: aqlSchema,
  severity: z.string().optional(),
});

/** How a lot's sample is drawn: at random (seed recorded, chosen by the server unless given) or by naming tray positions. */
export const lotSampleDrawInputSchema = z.discriminatedUnion("method", [
  z.object({
    method: z.literal("random"),
    seed: z
      .number({ error: "The seed is a whole number from 0 to 4 294 967 295." })
      .int({ error: "The seed is a whole number from 0 to 4 294 967 295." })
      .min(0, { error: "The seed is a whole number from 0 to 4 294 967 295." })
      .max(2 ** 32 - 1, { error: "The seed is a whole number from 0 to 4 294 967 295." })
      .optional(),
  }),
  z.object({
    method: z.literal("chosen"),
    positions: z.array(z.number().int({ error: "Tray positions are whole numbers." }), { error: "List the tray positions drawn." }),
  }),
]);
export type LotSampleDrawInput = z.input<typeof lotSampleDrawInputSchema>;
