import { z } from "zod";
import { richTextDocSchema } from "@/lib/rich-text";
import { procedureSchema } from "@/protocols";

/** What an engineer saves for a draft version: the step list plus its rich-text parts. */
export const procedureDraftSchema = z.object({
  definition: procedureSchema,
  instructions: richTextDocSchema.default(null),
  cautions: richTextDocSchema.default(null),
  acknowledgedCautions: z.array(z.string().max(200)).max(200).default([]),
});
export type ProcedureDraftInput = z.infer<typeof procedureDraftSchema>;

export const reasonSchema = z.string().trim().min(3, "Give a reason (a few words at least).").max(2000);
