import { z } from "zod";

export const versionParamsSchema = z.object({ id: z.uuid("Not a procedure id."), n: z.coerce.number<string>().int().min(1) });
