"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { requireActionPermission } from "@/lib/auth/guards";
import { amendCertificate, revokeCertificate } from "@/lib/certificates/amend-certificate";
import { certificateNumberSchema } from "@/lib/certificate-list/certificate-number";
import { toActionState, type ActionState } from "@/lib/forms/action-state";

const changeSchema = z.object({
  number: certificateNumberSchema,
  reason: z.string().trim().min(10, "Say why in a sentence (at least 10 characters): it is printed on the record.").max(2000),
  password: z.string().min(1, "Enter your password to sign."),
});

export async function amendCertificateAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const actor = await requireActionPermission("certificate.sign");
    const input = changeSchema.parse(Object.fromEntries(form));
    const { number } = await amendCertificate(actor, input.number, { password: input.password, reason: input.reason });
    revalidatePath("/certificates");
    return { ok: true, message: `Certificate ${number} was issued and replaces ${input.number}, which now shows as superseded.` };
  } catch (error) {
    return toActionState(error);
  }
}

export async function revokeCertificateAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  try {
    const actor = await requireActionPermission("certificate.sign");
    const input = changeSchema.parse(Object.fromEntries(form));
    await revokeCertificate(actor, input.number, { password: input.password, reason: input.reason });
    revalidatePath("/certificates");
    return { ok: true, message: `Certificate ${input.number} is revoked. Its public page now says so.` };
  } catch (error) {
    return toActionState(error);
  }
}
