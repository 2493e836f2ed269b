import { can } from "@/lib/auth/permissions";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import type { ProcedureStatus } from "@/db/schema";

/** Engineers see every version; everyone else sees only what was released (and later withdrawn). */
export function canSeeVersion(user: SignedInUser, status: ProcedureStatus): boolean {
  return can(user.role, "procedure.author") || status === "released" || status === "withdrawn";
}
