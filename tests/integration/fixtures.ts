import { getDb } from "@/db";
import type { Role } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { createProcedure, releaseVersion, submitForReview } from "@/lib/procedures/lifecycle";
import { procedureDraftSchema } from "@/lib/procedures/procedure-input";
import { ratedCapacityAt20cTemplate, type Procedure } from "@/protocols";
import type { SignedInUser } from "@/lib/auth/signed-in-user";

/** Inserts a user straight into the test database and returns them as the app sees a caller. */
export async function makeUser(role: Role, name: string): Promise<SignedInUser> {
  const id = `${role}-${name.toLowerCase().replace(/\W+/g, "-")}`;
  const email = `${id}@test.example`;
  await getDb()
    .insertInto("app_user")
    .values({ id, email, display_name: name, role, password_hash: "not used" })
    .onConflict((oc) => oc.doNothing())
    .execute();
  return { id, email, displayName: name, role };
}

/** Sets a user's password, for tests of signing (which asks for it again). */
export async function setPassword(user: SignedInUser, password: string): Promise<SignedInUser> {
  await getDb().updateTable("app_user").set({ password_hash: await hashPassword(password) }).where("id", "=", user.id).execute();
  return user;
}

/** How the synthetic logs of scenarios/rated-capacity-run.ts are written: elapsed seconds, discharge current negative. */
export const ELAPSED_LOG_MAPPING = {
  time: { form: "elapsed", column: "Time (s)", unit: "s" },
  voltage: { column: "Voltage (V)", unit: "V" },
  current: { column: "Current (A)", unit: "A", dischargeSign: "negative" },
  delimiter: ",",
  decimalSeparator: ".",
  headerLine: 1,
};

/** A text as the upload stream delivers it: 64 KiB chunks of UTF-8. */
export async function* chunksOf(text: string, size = 64 * 1024) {
  const bytes = new TextEncoder().encode(text);
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, i + size);
}

/**
 * The rated-capacity template released under its own code: drafted and submitted by one engineer,
 * released by a second (the rule the database enforces). Optionally under another decision rule.
 */
export async function releaseRatedCapacityProcedure(
  author: SignedInUser,
  releaser: SignedInUser,
  code: string,
  decisionRule?: Procedure["decisionRule"],
): Promise<{ procedureId: string; versionId: string }> {
  const definition = structuredClone(ratedCapacityAt20cTemplate);
  definition.header.code = code;
  if (decisionRule) definition.decisionRule = decisionRule;
  const { procedureId, versionId } = await createProcedure(author, procedureDraftSchema.parse({ definition }));
  await submitForReview(author, versionId);
  await releaseVersion(releaser, versionId);
  return { procedureId, versionId };
}
