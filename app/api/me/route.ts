import { apiRoute } from "@/lib/auth/guards";
import { ROLE_PERMISSIONS } from "@/lib/auth/permissions";

export const GET = apiRoute("/api/me", "GET", async (_req, { user }) =>
  Response.json({ user, permissions: ROLE_PERMISSIONS[user.role] }),
);
