import "server-only";
import { z } from "zod";

const caughtMailSchema = z.object({
  id: z.string(),
  receivedAt: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
});
export type CaughtMail = z.infer<typeof caughtMailSchema>;

/** Where the local mail catcher lists what it received (scripts/mail-catcher.mjs), if it runs. */
export function getMailCatcherUrl(): string | null {
  return process.env.MAIL_CATCHER_URL?.trim().replace(/\/+$/, "") || null;
}

/** The catcher's inbox, newest first; a catcher that does not answer is said so, never thrown. */
export async function readCatcherInbox(baseUrl: string, limit = 50): Promise<{ ok: true; messages: CaughtMail[] } | { ok: false; error: string }> {
  try {
    const res = await fetch(`${baseUrl}/messages`, { cache: "no-store", signal: AbortSignal.timeout(3_000) });
    if (!res.ok) return { ok: false, error: `it answered HTTP ${res.status}` };
    const parsed = z.array(caughtMailSchema).safeParse(await res.json());
    if (!parsed.success) return { ok: false, error: "its answer was not a list of messages" };
    return { ok: true, messages: parsed.data.slice(0, limit) };
  } catch (error) {
    return { ok: false, error: error instanceof Error ? error.message : String(error) };
  }
}
