import { z } from "zod";

/** What a reviewer sends to return a run: what the operator must fix. */
export const returnRunInputSchema = z.object({
  comments: z
    .string()
    .trim()
    .min(1, "Say what the operator must fix: a returned run needs comments.")
    .max(4000, "Keep the comments under 4 000 characters."),
});
export type ReturnRunInput = z.input<typeof returnRunInputSchema>;

export const acknowledgementSchema = z.object({
  findingId: z.string().min(1).max(300),
  note: z.string().trim().min(1, "Write a short note on this deviation.").max(1000, "Keep the note under 1 000 characters."),
});

/** What a reviewer sends to accept and sign a run. */
export const acceptRunInputSchema = z.object({
  password: z.string().min(1, "Enter your password to sign.").max(256),
  acknowledgements: z.array(acknowledgementSchema).max(500),
  /** The evaluation the reviewer read; the acceptance is refused if the run was evaluated again since. */
  evaluationId: z.uuid().optional(),
});
export type AcceptRunInput = z.input<typeof acceptRunInputSchema>;
