"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { amendCertificate, revokeCertificate } from "@/lib/certificates/amend-certificate";
import { certificateNumberSchema } from "@/lib/certificate-list/certificate-number";
import { serverAction } from "@/lib/forms/server-action";

const changeSchema = z.object({
  number: certificateNumberSchema,
  reason: z.string().trim().min(10, "Say why in a sentence (at least 10 characters): it is printed on the record.").max(2000),
  password: z.string().min(1, "Enter your password to sign."),
});

export const amendCertificateAction = serverAction({ access: "certificate.sign", input: changeSchema }, async ({ user: actor, input }) => {
  const { number } = await amendCertificate(actor, input.number, { password: input.password, reason: input.reason });
  revalidatePath("/certificates");
  return { ok: true, message: `Certificate ${number} was issued and replaces ${input.number}, which now shows as superseded.` };
});

export const revokeCertificateAction = serverAction({ access: "certificate.sign", input: changeSchema }, async ({ user: actor, input }) => {
  await revokeCertificate(actor, input.number, { password: input.password, reason: input.reason });
  revalidatePath("/certificates");
  return { ok: true, message: `Certificate ${input.number} is revoked. Its public page now says so.` };
});
