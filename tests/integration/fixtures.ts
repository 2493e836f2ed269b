import { getDb } from "@/db";
import type { Role } from "@/db/schema";
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
