import { z } from "zod";

/** Certificate numbers as the database issues them: C-00001 (migrations/0005). */
export const certificateNumberSchema = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^C-\d{5,}$/, "A certificate number looks like C-00012.");
