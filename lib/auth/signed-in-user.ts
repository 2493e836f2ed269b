import type { Role } from "@/db/schema";

/** The caller as the app sees it once the session is valid. Safe to pass to client components. */
export interface SignedInUser {
  id: string;
  email: string;
  displayName: string;
  role: Role;
}
