import type { ActionState } from "@/lib/forms/action-state";

/** What issuing a token answers to its form: the token itself, this once, beside the usual message. */
export interface IssuedTokenState extends ActionState {
  issued?: { token: string; label: string; channel: string; expiresOn: string };
}
