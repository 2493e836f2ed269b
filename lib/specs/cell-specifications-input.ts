import { z } from "zod";
import { cellSpecificationSchema } from "@/protocols";

export const cellSpecificationInputSchema = z.object({
  maker: z.string().trim().min(1, "Name the maker.").max(100),
  model: z.string().trim().min(1, "Name the model.").max(100),
  data: cellSpecificationSchema,
});
export type CellSpecificationInput = z.infer<typeof cellSpecificationInputSchema>;
