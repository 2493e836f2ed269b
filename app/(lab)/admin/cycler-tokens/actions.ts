"use server";

import { revalidatePath } from "next/cache";
import { serverAction } from "@/lib/forms/server-action";
import type { IssuedTokenState } from "@/lib/machine-tokens/issued-token-state";
import { issueMachineToken, issueTokenSchema, revokeMachineToken, revokeTokenSchema } from "@/lib/machine-tokens/token-admin";

export const issueTokenAction = serverAction({ access: "/admin/cycler-tokens", input: issueTokenSchema }, async ({ user, input }) => {
  const issued = await issueMachineToken(user, input);
  revalidatePath("/admin/cycler-tokens");
  const expiresOn = issued.expiresAt.toISOString().slice(0, 10);
  const state: IssuedTokenState = {
    ok: true,
    message: `Token "${issued.label}" issued for ${issued.channel}, valid until ${expiresOn}.`,
    issued: { token: issued.token, label: issued.label, channel: issued.channel, expiresOn },
  };
  return state;
});

export const revokeTokenAction = serverAction({ access: "/admin/cycler-tokens", input: revokeTokenSchema }, async ({ user, input }) => {
  const revoked = await revokeMachineToken(user, input);
  revalidatePath("/admin/cycler-tokens");
  return { ok: true, message: `Token "${revoked.label}" for ${revoked.channel} is revoked: it is refused from now on.` };
});
